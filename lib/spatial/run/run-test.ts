/**
 * The single entry of the engine for a distribution-test run: `runDistributionTest(spec)` takes the
 * JSON-able description of run-spec.ts and returns a JSON-able result with, per test, the verdict at the
 * chosen level, the p-value, the test and null used, simulations and seed, the curves and bands, where the
 * observed curve leaves the band, and the cautions of statistics.md.
 */
import { SpatialInputError } from "../errors";
import type { SimulationPool } from "../simulation/run-simulations";
import { GENERAL_CAUTIONS, testCautions } from "./run-cautions";
import { classicTest } from "./run-classic-tests";
import type { RunContext } from "./run-context";
import { crossLTest, kDifferenceTest, lEnvelopeTest } from "./run-curve-tests";
import type { EnvelopeOutcome } from "./run-envelope";
import { extraCurveTest } from "./run-extra-tests";
import { parseRunSpec, type RunSpec, type TestSpec } from "./run-spec";
import { verdictOf, type Verdict } from "./run-verdict";
import { ENGINE_VERSION } from "../version";
import { createWindow } from "../geometry/window";

export interface TestResult {
  type: TestSpec["type"];
  /** Published name of the method and the null it was tested against. */
  test: string;
  null: string;
  options: TestSpec;
  verdict: Verdict;
  /** One sentence for the finds specialist. */
  summary: string;
  pValue: number;
  level: number;
  nsim: number | null;
  seed: number;
  n: number;
  details: Record<string, unknown>;
  curves?: EnvelopeOutcome;
  /** The picture a test without curves is drawn with (Clark–Evans, quadrat counts). */
  picture?: TestPicture;
  cautions: string[];
}

/** One quadrat cell clipped to the trench, with the count observed in it and the count expected under CSR. */
export interface QuadratCellCount {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  count: number;
  expected: number;
}

export type TestPicture =
  /** Nearest-neighbour distances (estimators/nn-histogram.ts). */
  | { kind: "nn-histogram"; edges: number[]; counts: number[] }
  /** The quadrat test's own cells, top row first, in the order of `details.observed`. */
  | { kind: "quadrat-cells"; cells: QuadratCellCount[] };

export interface RunResult {
  engineVersion: string;
  seed: number;
  nsim: number;
  level: number;
  window: { area: number; perimeter: number; holes: number };
  points: number;
  results: TestResult[];
  cautions: string[];
}

export interface RunOptions {
  onProgress?: (fraction: number) => void;
  signal?: AbortSignal;
  /** A long-lived pool to use; without it the run makes its own with `createPool`, or runs in this thread. */
  pool?: SimulationPool | null;
  /**
   * Starts a pool of `threads` threads (undefined: the pool's default) for this run only, destroyed at its
   * end; asked when the spec's `workers` is not 0 and the run is not small. The engine starts no threads itself.
   */
  createPool?: (threads: number | undefined) => SimulationPool;
  /** The description was read back from storage: unknown keys are dropped instead of refused. */
  stored?: boolean;
}

/** Finds × simulations below which a run stays in the calling thread unless `workers` is given. */
export const SMALL_RUN = 100_000;

async function runOne(
  ctx: RunContext,
  t: TestSpec,
): Promise<Omit<TestResult, "options" | "level" | "seed" | "cautions">> {
  if (t.type === "clark-evans" || t.type === "quadrat") return classicTest(ctx, t);
  let curves: EnvelopeOutcome;
  if (t.type === "l-envelope") curves = await lEnvelopeTest(ctx, t);
  else if (t.type === "cross-l") curves = await crossLTest(ctx, t);
  else if (t.type === "k-difference") curves = await kDifferenceTest(ctx, t);
  else curves = await extraCurveTest(ctx, t);
  const n =
    t.type === "l-envelope" || t.type === "pcf-envelope" || t.type === "inhomogeneous-l"
      ? ctx.spec.points.filter((p) => t.class === undefined || p.cls === t.class).length
      : ctx.spec.points.filter((p) => p.cls === t.a || p.cls === t.b).length;
  const v = verdictOf(t, curves.pValue, ctx.spec.level, curves.direction);
  return {
    type: t.type,
    test: v.test,
    null: v.nullName,
    verdict: v.verdict,
    summary: v.summary,
    pValue: curves.pValue,
    nsim: curves.nsim,
    n,
    details: { statistic: curves.statistic },
    curves,
  };
}

export async function runDistributionTest(input: unknown, options: RunOptions = {}): Promise<RunResult> {
  const spec: RunSpec = parseRunSpec(input, { stored: options.stored });
  const window = createWindow(spec.window);
  // Starting worker threads costs more than a small run itself; the numbers are the same either way.
  const small = spec.points.length * spec.nsim < SMALL_RUN;
  const threads = spec.workers ?? (small ? 0 : undefined);
  const ownPool =
    options.pool === undefined && threads !== 0 && options.createPool ? options.createPool(threads) : null;
  const pool = options.pool ?? ownPool;
  const results: TestResult[] = [];
  try {
    for (let i = 0; i < spec.tests.length; i++) {
      const t = spec.tests[i];
      const ctx: RunContext = {
        spec,
        window,
        pool,
        signal: options.signal,
        testIndex: i,
        progress: (f) => options.onProgress?.((i + f) / spec.tests.length),
      };
      const done = await runOne(ctx, t);
      if (!Number.isFinite(done.pValue))
        throw new SpatialInputError(`Test ${i + 1} (${t.type}) gave no finite p-value.`);
      const cautions = testCautions(t, done.n);
      const range = done.curves?.range;
      if (range && !range.wholeGrid) {
        cautions.push(
          `Border correction: the curve is undefined beyond the r where no point lies deep enough inside the trench, so the test used r from ${range.from} to ${Number(range.to.toPrecision(4))} m only (${range.values} of ${done.curves!.r.length} grid values), where the observed and every simulated curve are defined.`,
        );
      }
      results.push({ ...done, options: t, level: spec.level, seed: spec.seed, cautions });
      ctx.progress(1);
    }
  } finally {
    await ownPool?.destroy();
  }
  return {
    engineVersion: ENGINE_VERSION,
    seed: spec.seed,
    nsim: spec.nsim,
    level: spec.level,
    window: { area: window.area, perimeter: window.perimeter, holes: window.holes.length },
    points: spec.points.length,
    results,
    cautions: GENERAL_CAUTIONS,
  };
}
