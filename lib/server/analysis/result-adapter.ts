/**
 * The engine's run result (lib/spatial/run/run-test.ts) turned into Loamwork's stored result: curves as
 * L(r) − r (0 under CSR) ready to plot, verdict words, the sentence to quote, the question each test
 * answered, the cautions, and the pictures that are not tests (NN histogram, quadrat grid, heat layer).
 */
import { quadratGrid, type RunResult as EngineResult, type TestResult as EngineTest, type Window } from "@/lib/spatial";
import type { SpecClass, SpecFind } from "./engine-spec";
import { kernelDensity, type Pts } from "./plot-data";
import { questionOf } from "./questions";
import type { ClassInScope, Curve, Departure, RunResult, TestOut, VerdictWord } from "@/lib/api/run-result";
import type { Correction, RunTest } from "@/lib/schemas/run";

const VERDICTS: Record<string, VerdictWord> = {
  clustered: "clustered",
  "evenly spread": "regular",
  together: "associated",
  apart: "segregated",
  "no evidence against the null": "no-evidence",
};

const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
const minus = (a: (number | null)[], r: number[]) =>
  a.map((v, k) => {
    const rk = r[k];
    // A value without its distance is not drawn: a gap, as where the curve is undefined.
    return v === null || rk === undefined ? null : Number((v - rk).toPrecision(8));
  });

function curveOf(t: EngineTest, subtractR: boolean): { curve: Curve; departures: Departure[] } {
  const c = t.curves;
  if (!c) throw new Error(`The engine's ${t.type} result has no curves to plot.`);
  const f = (a: (number | null)[]) => (subtractR ? minus(a, c.r) : a);
  return {
    curve: { r: c.r, obs: f(c.observed), lo: f(c.band.lo), hi: f(c.band.hi), theo: f(c.reference) },
    departures: c.excursions.map((e) => ({ side: e.side, from: e.from, to: e.to, rejoins: e.rejoins })),
  };
}

function sentenceOf(t: EngineTest): string {
  const sims = t.nsim ? `, ${t.nsim} simulations` : "";
  // The engine's summary may end by naming the test in brackets; it is named once, below.
  const summary = t.summary.replace(/\s\((?:[^()]|\([^()]*\))*\)\.$/, ".");
  return `${summary} Test: ${t.test}; null: ${t.null}${sims}; seed ${t.seed}.`;
}

/** The edge correction the run's curves used, shown with the result: its L test's, else its first curve test's. */
function correctionOf(tests: RunTest[]): Correction {
  const l = tests.find((t) => t.type === "l-envelope");
  if (l) return l.correction;
  for (const t of tests) if ("correction" in t && t.type !== "clark-evans") return t.correction;
  return "isotropic";
}

export type AdaptInput = {
  engine: EngineResult;
  /** The run's tests as stored (class ids), one for each of the engine's results. */
  tests: RunTest[];
  window: Window;
  classes: (SpecClass & { label: string; colour: string; symbol: string })[];
  finds: SpecFind[];
  rmax: number;
  elapsedMs: number;
};

export function adaptResult(input: AdaptInput): RunResult {
  const { engine, window, classes, finds } = input;
  const pts = new Map<string, Pts>(classes.map((c) => [c.id, { x: [], y: [] }]));
  for (const f of finds) {
    const p = pts.get(f.classId);
    if (p) {
      p.x.push(f.x);
      p.y.push(f.y);
    }
  }
  const label = new Map(classes.map((c) => [c.id, `${c.code} (${c.label.toLowerCase()})`]));
  const name = (id: string) => label.get(id) ?? id;
  const pool = `${finds.length} ${classes.map((c) => c.code).join(" + ")}`;
  const tests: TestOut[] = engine.results.map((t, i) => {
    const spec = input.tests[i];
    if (!spec) throw new Error(`The engine returned ${engine.results.length} results for ${input.tests.length} tests.`);
    const base = {
      verdict: VERDICTS[t.verdict] ?? "no-evidence",
      sentence: sentenceOf(t),
      p: num(t.pValue),
      question: questionOf(spec, name, pool),
      notes: t.cautions,
    };
    const d = t.details;
    const classId = ("class" in spec && spec.class) || "";
    const n = pts.get(classId)?.x.length ?? t.n;
    switch (spec.type) {
      case "clark-evans": {
        const h = t.picture?.kind === "nn-histogram" ? t.picture : { edges: [], counts: [] };
        return {
          ...base,
          kind: "clark-evans",
          classId,
          n,
          R: num(d.R) ?? NaN,
          z: num(d.z),
          meanNN: num(d.meanNNDistance) ?? NaN,
          expectedNN: num(d.meanNNDistanceUnderCsr) ?? num(d.expectedUnderCsr) ?? 0.5 / Math.sqrt(n / window.area),
          correction: spec.correction,
          alternative: spec.alternative,
          histogram: { edges: h.edges, counts: h.counts },
        };
      }
      case "quadrat": {
        const { nx } = spec.cellSize === undefined ? spec : quadratGrid(window, spec.cellSize);
        const cells = t.picture?.kind === "quadrat-cells" ? t.picture.cells : [];
        const mean = cells.reduce((s, c) => s + c.count, 0) / cells.length;
        const variance = cells.reduce((s, c) => s + (c.count - mean) ** 2, 0) / Math.max(1, cells.length - 1);
        return {
          ...base,
          kind: "quadrat",
          classId,
          n,
          cellSize: spec.cellSize ?? Number(((window.bbox.maxX - window.bbox.minX) / nx).toPrecision(6)),
          X2: num(d.X2) ?? num(d.statistic) ?? NaN,
          df: num(d.df) ?? cells.length - 1,
          vmr: num(d.varianceMeanRatio) ?? num(d.vmr) ?? variance / mean,
          monteCarlo: t.test.includes("Monte Carlo"),
          cells,
        };
      }
      case "l-envelope": {
        const { curve, departures } = curveOf(t, true);
        const above = departures.find((x) => x.side === "above");
        return {
          ...base,
          kind: "l-envelope",
          classId,
          n,
          statistic: spec.statistic,
          count: spec.count,
          curve,
          departures,
          clusterScale: above ? { from: above.from, to: above.to } : null,
        };
      }
      case "pcf-envelope":
        return {
          ...base,
          kind: "pcf-envelope",
          classId,
          n,
          curve: curveOf(t, false).curve,
          bandwidth: num(d.bandwidth) ?? 0,
        };
      case "cross-l":
      case "k-difference": {
        // cross-K is drawn as it is (πr² under CSR); L curves as L(r) − r
        const funK = spec.type === "cross-l" && spec.fun === "K";
        const { curve, departures } = curveOf(t, spec.type === "cross-l" && !funK);
        const { a, b } = spec;
        return {
          ...base,
          kind: spec.type,
          a,
          b,
          nA: pts.get(a)?.x.length ?? 0,
          nB: pts.get(b)?.x.length ?? 0,
          null: spec.type === "cross-l" ? spec.null : "random-labelling",
          ...(funK && { fun: "K" as const }),
          curve,
          departures,
        };
      }
      case "inhomogeneous-l": {
        const { curve, departures } = curveOf(t, true);
        return {
          ...base,
          kind: "inhomogeneous-l",
          classId,
          n,
          reference: spec.reference ?? "all",
          bandwidth: num(d.bandwidth) ?? 0,
          curve,
          departures,
        };
      }
    }
  });
  const inScope: ClassInScope[] = classes.map((c) => ({
    id: c.id,
    code: c.code,
    label: c.label,
    colour: c.colour,
    symbol: c.symbol,
    n: pts.get(c.id)!.x.length,
  }));
  return {
    engineVersion: engine.engineVersion,
    seed: engine.seed,
    nsim: engine.nsim,
    level: engine.level,
    rmax: input.rmax,
    correction: correctionOf(input.tests),
    outline: [window.outer, ...window.holes].map((r) => r.map((v) => [v[0], v[1]] as [number, number])),
    area: window.area,
    classes: inScope,
    tests,
    density: classes
      .filter((c) => pts.get(c.id)!.x.length >= 2)
      .map((c) => kernelDensity(window, pts.get(c.id)!, c.id)),
    points: classes.map((c) => ({ classId: c.id, ...pts.get(c.id)! })),
    cautions: engine.cautions,
    elapsedMs: input.elapsedMs,
  };
}
