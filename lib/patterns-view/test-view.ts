/**
 * A stored test result as the workspace and the report show it: the engine's verdict in plain words, the
 * sentence a specialist can quote, the question the test answered, its curves ready to plot (L curves as
 * L(r) − r, 0 under CSR) and its pictures, with classes named by their record ids. Pure functions of the
 * stored result (lib/api/run-result.ts): safe for client components and for the server alike.
 */
import type { ClassInScope, RunResult, StoredCurves, StoredTest } from "@/lib/api/run-result";
import type { QuadratCellCount, Verdict } from "@/lib/spatial";
import { questionOf } from "./questions";

export type VerdictWord = "clustered" | "regular" | "no-evidence" | "associated" | "segregated";

/** A stretch of distances where the observed curve lies outside the pointwise band. */
export type Departure = { side: "above" | "below"; from: number; to: number; rejoins: boolean };

/** null where the curve is undefined (border correction beyond the deepest points): a gap in the plot. */
export type Curve = {
  r: number[];
  obs: (number | null)[];
  lo?: (number | null)[];
  hi?: (number | null)[];
  theo?: (number | null)[];
};

type Base = {
  /** Plain-language verdict at the run's level. */
  verdict: VerdictWord;
  /** One sentence a specialist can quote, naming the test, p, simulations and seed. */
  sentence: string;
  p: number | null;
  /** Which question this test answered (and, for cross tests, what inflates it). */
  question: string;
  notes: string[];
};

export type ClarkEvansView = Base & {
  kind: "clark-evans";
  classId: string;
  n: number;
  R: number;
  z: number | null;
  meanNN: number;
  expectedNN: number;
  correction: "none" | "donnelly" | "monte-carlo";
  alternative: string;
  /** Nearest-neighbour distances histogram. */
  histogram: { edges: number[]; counts: number[] };
};
export type QuadratView = Base & {
  kind: "quadrat";
  classId: string;
  n: number;
  cellSize: number;
  X2: number;
  df: number;
  vmr: number;
  monteCarlo: boolean;
  cells: QuadratCellCount[];
};
export type LView = Base & {
  kind: "l-envelope";
  classId: string;
  n: number;
  statistic: "mad" | "dclf" | "rank";
  count: "fixed" | "poisson";
  /** L(r) − r and its band. */
  curve: Curve;
  departures: Departure[];
  /** Rough cluster diameter read from the first departure above (overstates, statistics.md). */
  clusterScale: { from: number; to: number } | null;
};
export type PcfView = Base & { kind: "pcf-envelope"; classId: string; n: number; curve: Curve; bandwidth: number };
export type CrossView = Base & {
  kind: "cross-l" | "k-difference";
  a: string;
  b: string;
  nA: number;
  nB: number;
  null: "random-labelling" | "a-fixed";
  /** "K": the test ran on cross-K and the curve is K_AB(r) itself; absent: cross-L, drawn as L_AB(r) − r. */
  fun?: "K";
  curve: Curve;
  departures: Departure[];
};
export type InhomView = Base & {
  kind: "inhomogeneous-l";
  classId: string;
  n: number;
  reference: string;
  bandwidth: number;
  curve: Curve;
  departures: Departure[];
};
export type TestView = ClarkEvansView | QuadratView | LView | PcfView | CrossView | InhomView;

const VERDICT_WORDS: Record<Verdict, VerdictWord> = {
  clustered: "clustered",
  "evenly spread": "regular",
  together: "associated",
  apart: "segregated",
  "no evidence against the null": "no-evidence",
};

/** The engine's verdict as the workspace words it. */
export const verdictWord = (v: Verdict): VerdictWord => VERDICT_WORDS[v] ?? "no-evidence";

const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);

/** L(r) − r from L(r), to 8 significant digits; a value without its distance is a gap, as an undefined one. */
export const minusR = (a: (number | null)[], r: number[]): (number | null)[] =>
  a.map((v, k) => {
    const rk = r[k];
    return v === null || rk === undefined ? null : Number((v - rk).toPrecision(8));
  });

/** The engine's curves ready to plot: L curves as L(r) − r, the others (g, K, K difference) as they are. */
export function curveOf(c: StoredCurves, subtractR: boolean): { curve: Curve; departures: Departure[] } {
  const f = (a: (number | null)[]) => (subtractR ? minusR(a, c.r) : a);
  return {
    curve: { r: c.r, obs: f(c.observed), lo: f(c.band.lo), hi: f(c.band.hi), theo: f(c.reference) },
    departures: c.excursions.map((e) => ({ side: e.side, from: e.from, to: e.to, rejoins: e.rejoins })),
  };
}

/** The sentence to quote: the engine's summary, then the test, its null, the simulations and the seed. */
export function sentenceOf(t: StoredTest): string {
  const sims = t.nsim ? `, ${t.nsim} simulations` : "";
  // The engine's summary may end by naming the test in brackets; it is named once, below.
  const summary = t.summary.replace(/\s\((?:[^()]|\([^()]*\))*\)\.$/, ".");
  return `${summary} Test: ${t.test}; null: ${t.null}${sims}; seed ${t.seed}.`;
}

/** Each stored test as the workspace shows it, in the run's order. */
export function testViews(run: RunResult): TestView[] {
  const byCode = new Map(run.classes.map((c) => [c.code, c]));
  const cls = (code: string | undefined): ClassInScope | undefined =>
    code === undefined ? undefined : byCode.get(code);
  const name = (code: string) => {
    const c = byCode.get(code);
    return c ? `${c.code} (${c.label.toLowerCase()})` : code;
  };
  const pool = `${run.classes.reduce((s, c) => s + c.n, 0)} ${run.classes.map((c) => c.code).join(" + ")}`;
  const outer = run.outline[0] ?? [];
  const width = Math.max(...outer.map((v) => v[0])) - Math.min(...outer.map((v) => v[0]));
  return run.results.map((t): TestView => {
    const spec = t.options;
    const base = {
      verdict: verdictWord(t.verdict),
      sentence: sentenceOf(t),
      p: num(t.pValue),
      question: questionOf(spec, name, pool),
      notes: t.cautions,
    };
    const d = t.details;
    const curves = (): StoredCurves => {
      if (!t.curves) throw new Error(`The ${t.type} result has no curves to plot.`);
      return t.curves;
    };
    const one = "class" in spec ? cls(spec.class) : undefined;
    const classId = one?.id ?? "";
    const n = one?.n ?? t.n;
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
          expectedNN: num(d.meanNNDistanceUnderCsr) ?? num(d.expectedUnderCsr) ?? 0.5 / Math.sqrt(n / run.window.area),
          correction: spec.correction,
          alternative: spec.alternative,
          histogram: { edges: h.edges, counts: h.counts },
        };
      }
      case "quadrat": {
        const cells = t.picture?.kind === "quadrat-cells" ? t.picture.cells : [];
        const mean = cells.reduce((s, c) => s + c.count, 0) / cells.length;
        const variance = cells.reduce((s, c) => s + (c.count - mean) ** 2, 0) / Math.max(1, cells.length - 1);
        return {
          ...base,
          kind: "quadrat",
          classId,
          n,
          cellSize: spec.cellSize ?? Number((width / spec.nx).toPrecision(6)),
          X2: num(d.X2) ?? num(d.statistic) ?? NaN,
          df: num(d.df) ?? cells.length - 1,
          vmr: num(d.varianceMeanRatio) ?? num(d.vmr) ?? variance / mean,
          monteCarlo: t.test.includes("Monte Carlo"),
          cells,
        };
      }
      case "l-envelope": {
        const { curve, departures } = curveOf(curves(), true);
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
          curve: curveOf(curves(), false).curve,
          bandwidth: num(d.bandwidth) ?? 0,
        };
      case "cross-l":
      case "k-difference": {
        // cross-K is drawn as it is (πr² under CSR); L curves as L(r) − r
        const funK = spec.type === "cross-l" && spec.fun === "K";
        const { curve, departures } = curveOf(curves(), spec.type === "cross-l" && !funK);
        const a = cls(spec.a),
          b = cls(spec.b);
        return {
          ...base,
          kind: spec.type,
          a: a?.id ?? spec.a,
          b: b?.id ?? spec.b,
          nA: a?.n ?? 0,
          nB: b?.n ?? 0,
          null: spec.type === "cross-l" ? spec.null : "random-labelling",
          ...(funK && { fun: "K" as const }),
          curve,
          departures,
        };
      }
      case "inhomogeneous-l": {
        const { curve, departures } = curveOf(curves(), true);
        return {
          ...base,
          kind: "inhomogeneous-l",
          classId,
          n,
          reference: spec.reference === undefined ? "all" : (cls(spec.reference)?.id ?? spec.reference),
          bandwidth: num(d.bandwidth) ?? 0,
          curve,
          departures,
        };
      }
    }
  });
}
