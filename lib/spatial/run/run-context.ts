/** What every test of a run shares: the window, the parsed spec, the pool, progress and cancellation. */
import { SpatialInputError } from "../errors";
import { checkPattern } from "../geometry/pattern";
import type { SimulationPool } from "../simulation/run-simulations";
import type { RunSpec } from "./run-spec";
import type { Points, Window } from "../types";

export interface RunContext {
  spec: RunSpec;
  window: Window;
  pool: SimulationPool | null;
  signal?: AbortSignal;
  /** Report progress of the current test, 0..1. */
  progress(fraction: number): void;
  /** Index of the current test, used to give each test its own range of random streams. */
  testIndex: number;
}

/** Random streams per test: test t uses streams t·2^24 + 1 … (stream 0 of a test breaks ties). */
export const STREAMS_PER_TEST = 2 ** 24;

/** The points of one class (or all points when cls is undefined), checked against the window. */
export function classPoints(ctx: RunContext, cls: string | undefined, minPoints = 2): Points {
  const chosen = ctx.spec.points.filter((p) => cls === undefined || p.cls === cls);
  const label = cls === undefined ? "the finds" : `class "${cls}"`;
  if (cls !== undefined && chosen.length === 0) {
    const known = [...new Set(ctx.spec.points.map((p) => p.cls).filter((c) => c !== undefined))];
    throw new SpatialInputError(`No find has class "${cls}" (classes present: ${known.join(", ") || "none"}).`);
  }
  return checkPattern(ctx.window, { x: chosen.map((p) => p.x), y: chosen.map((p) => p.y) }, { label, minPoints });
}
