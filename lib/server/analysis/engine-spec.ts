/**
 * From a Loamwork run (scope read from the database, tests, parameters) to the engine's JSON run spec
 * (lib/spatial/run/run-spec.ts; docs/spatial-cli.md). Classes are named by their site code in the spec.
 * Each engine test remembers which Loamwork test and class it came from, so results map back.
 */
import type { RunSpecInput, Window } from "@/lib/spatial";
import { R_COUNT } from "./defaults";
import type { Correction, RunTest } from "@/lib/schemas/run";

export type SpecClass = { id: string; code: string };
export type SpecFind = { x: number; y: number; classId: string };
export type SpecEntry = { test: RunTest; classId?: string };
export type EngineTest = RunSpecInput["tests"][number];

export type BuildInput = {
  window: Window;
  classes: SpecClass[];
  finds: SpecFind[];
  tests: RunTest[];
  params: { correction: Correction; rmax: number; nsim: number; level: number };
  seed: number;
};

/** Quadrat grid for a requested cell size: as many equal cells across the bounding box as fit. */
export function quadratGrid(window: Window, cellSize: number): { nx: number; ny: number } {
  const { bbox } = window;
  const clamp = (v: number) => Math.max(1, Math.min(50, Math.round(v)));
  return { nx: clamp((bbox.maxX - bbox.minX) / cellSize), ny: clamp((bbox.maxY - bbox.minY) / cellSize) };
}

export function buildEngineSpec(input: BuildInput): { spec: RunSpecInput; entries: SpecEntry[] } {
  const { window, classes, finds, tests, params, seed } = input;
  const code = new Map(classes.map((c) => [c.id, c.code]));
  const entries: SpecEntry[] = [];
  const out: EngineTest[] = [];
  // The engine's between-class estimators offer isotropic and translation; border falls back to isotropic.
  const pairCorrection = params.correction === "translation" ? "translation" : "isotropic";
  const push = (t: EngineTest, entry: SpecEntry) => {
    out.push(t);
    entries.push(entry);
  };
  for (const t of tests) {
    switch (t.kind) {
      case "clark-evans":
        for (const c of classes)
          push(
            { type: "clark-evans", class: c.code, correction: t.correction, alternative: t.alternative },
            { test: t, classId: c.id },
          );
        break;
      case "quadrat": {
        const { nx, ny } = quadratGrid(window, t.cellSize);
        for (const c of classes) push({ type: "quadrat", class: c.code, nx, ny }, { test: t, classId: c.id });
        break;
      }
      case "l-envelope":
        for (const c of classes)
          push(
            {
              type: "l-envelope",
              class: c.code,
              count: t.count,
              correction: params.correction,
              statistic: t.statistic,
            },
            { test: t, classId: c.id },
          );
        break;
      case "pcf-envelope":
        for (const c of classes)
          push({ type: "pcf-envelope", class: c.code, count: "fixed", statistic: "dclf" }, { test: t, classId: c.id });
        break;
      case "cross-l":
        push(
          {
            type: "cross-l",
            a: code.get(t.a)!,
            b: code.get(t.b)!,
            null: t.null,
            count: "fixed",
            correction: pairCorrection,
            statistic: "dclf",
            ...(t.fun === "K" && { fun: "K" as const }),
          },
          { test: t },
        );
        break;
      case "k-difference":
        push(
          { type: "k-difference", a: code.get(t.a)!, b: code.get(t.b)!, correction: pairCorrection, statistic: "dclf" },
          { test: t },
        );
        break;
      case "inhomogeneous-l":
        push(
          {
            type: "inhomogeneous-l",
            class: code.get(t.classId)!,
            reference: t.reference === "all" ? undefined : code.get(t.reference),
            statistic: "dclf",
          },
          { test: t, classId: t.classId },
        );
        break;
    }
  }
  const ring = (r: readonly (readonly [number, number] | [number, number])[]) =>
    r.map((v) => [v[0], v[1]] as [number, number]);
  const spec: RunSpecInput = {
    window: { outer: ring(window.outer), holes: window.holes.map(ring) },
    points: finds.map((f) => ({ x: f.x, y: f.y, cls: code.get(f.classId)! })),
    seed,
    nsim: params.nsim,
    level: params.level,
    r: { max: params.rmax, count: R_COUNT },
    tests: out,
  };
  return { spec, entries };
}
