/**
 * The stored result of a run, as the workspace reads it. Loamwork's own shape, built from the engine's
 * output by lib/server/analysis/result-adapter.ts, so the plots and verdicts do not depend on the engine's internal
 * types.
 * Plain numbers and arrays only (it is stored as JSON in analysis_runs.result). Types only: safe to
 * import from client components.
 */
import type { Correction, SquareTestKind } from "@/lib/schemas/run";

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

export type ClassInScope = { id: string; code: string; label: string; colour: string; symbol: string; n: number };

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

export type ClarkEvansOut = Base & {
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
export type QuadratCell = { x0: number; y0: number; x1: number; y1: number; count: number; expected: number };
export type QuadratOut = Base & {
  kind: "quadrat";
  classId: string;
  n: number;
  cellSize: number;
  X2: number;
  df: number;
  vmr: number;
  monteCarlo: boolean;
  cells: QuadratCell[];
};
export type LOut = Base & {
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
export type PcfOut = Base & { kind: "pcf-envelope"; classId: string; n: number; curve: Curve; bandwidth: number };
export type CrossOut = Base & {
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
export type InhomOut = Base & {
  kind: "inhomogeneous-l";
  classId: string;
  n: number;
  reference: string;
  bandwidth: number;
  curve: Curve;
  departures: Departure[];
};
export type TestOut = ClarkEvansOut | QuadratOut | LOut | PcfOut | CrossOut | InhomOut;

/** Verdict of a square-count test: like values together, high and low alternating, hot or cold spots found. */
export type SquareVerdictWord = "clustered" | "dispersed" | "hot-spots" | "no-evidence" | "not-run";
export type SquareClassWord = "hot spot" | "cold spot" | "high among low" | "low among high" | "none";

/** One square of the grid in a square-count result, placed on the plan (its whole square, x0..x1, y0..y1). */
export type SquareCellOut = {
  label: string;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  /** Excavated m² used, and the variable tested (density per m² or count). */
  area: number;
  value: number;
  /** Local tests: local I_i or Gi* (a z-score), the permutation p and the false-discovery-rate adjusted p. */
  statistic: number | null;
  p: number | null;
  pAdjusted: number | null;
  class: SquareClassWord;
};

/** A test on counts by grid square, for one class (lib/spatial/lattice, through runSquareTest). */
export type SquareTestOut = {
  kind: SquareTestKind;
  classId: string;
  verdict: SquareVerdictWord;
  sentence: string;
  p: number | null;
  pFrom: "permutation" | "randomisation" | "normal" | null;
  question: string;
  notes: string[];
  /** Squares tested, and those left out with the reason. */
  n: number;
  leftOut: { label: string; reason: string }[];
  neighbours: string;
  style: "row" | "binary";
  variable: "density" | "count";
  permutations: number;
  seed: number;
  /** Global tests: the statistic and its expectation under the null. */
  statistic: number | null;
  expected: number | null;
  z: number | null;
  gridSize: number;
  cells: SquareCellOut[];
};

/** Kernel intensity on a pixel grid (row 0 at minY), for the heat layer on the plan. */
export type DensityOut = {
  classId: string;
  nx: number;
  ny: number;
  minX: number;
  minY: number;
  dx: number;
  dy: number;
  values: number[];
  bandwidth: number;
  rule: string;
};

export type RunResult = {
  engineVersion: string;
  seed: number;
  nsim: number;
  level: number;
  rmax: number;
  correction: Correction;
  outline: [number, number][][];
  area: number;
  classes: ClassInScope[];
  tests: TestOut[];
  density: DensityOut[];
  /** Where each class's finds lie, for the plan overlay. */
  points: { classId: string; x: number[]; y: number[] }[];
  /** Tests on counts by grid square (absent in runs stored before they existed). */
  squareTests?: SquareTestOut[];
  /** statistics.md's cautions, as the engine words them. */
  cautions: string[];
  elapsedMs: number;
  /** When the engine started and finished (server clock, ms since 1970), to see where a run's time went. */
  timing?: { engineStart: number; engineEnd: number };
};
