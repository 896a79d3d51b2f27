/**
 * A stored run handed to the engine: its tests as stored (they are the engine's own test descriptions,
 * lib/spatial/run/run-spec.ts), with the run's records as the window and points. The only change: the tests
 * and points name classes by their record id, and the engine is given the site's class codes instead, so
 * that its sentences ("Classes FLK and CHP go together") read in the site's words.
 */
import type { RunSpecInput, TestSpec, Window } from "@/lib/spatial";
import { R_COUNT } from "./defaults";
import type { RunTest } from "@/lib/schemas/run";

export type SpecClass = { id: string; code: string };
export type SpecFind = { x: number; y: number; classId: string };

export type BuildInput = {
  window: Window;
  classes: SpecClass[];
  finds: SpecFind[];
  tests: RunTest[];
  params: { rmax: number; nsim: number; level: number };
  seed: number;
};

export function buildEngineSpec(input: BuildInput): RunSpecInput {
  const { window, classes, finds, tests, params, seed } = input;
  const codes = new Map(classes.map((c) => [c.id, c.code]));
  const code = (id: string) => {
    const c = codes.get(id);
    if (c === undefined) throw new Error(`A test names class ${id}, which is not in the run's scope.`);
    return c;
  };
  const ring = (r: readonly (readonly [number, number] | [number, number])[]) =>
    r.map((v) => [v[0], v[1]] as [number, number]);
  return {
    window: { outer: ring(window.outer), holes: window.holes.map(ring) },
    points: finds.map((f) => ({ x: f.x, y: f.y, cls: code(f.classId) })),
    seed,
    nsim: params.nsim,
    level: params.level,
    r: { max: params.rmax, count: R_COUNT },
    tests: tests.map((t) => engineTest(t, code)),
  };
}

/** A stored test with its classes named by `code` instead of their record ids, as the engine is given it. */
export function engineTest(t: RunTest, code: (id: string) => string): TestSpec {
  return t.type === "cross-l" || t.type === "k-difference"
    ? { ...t, a: code(t.a), b: code(t.b) }
    : t.type === "inhomogeneous-l"
      ? { ...t, class: code(t.class ?? ""), reference: t.reference === undefined ? undefined : code(t.reference) }
      : { ...t, class: t.class === undefined ? undefined : code(t.class) };
}
