/**
 * The stored result of a run: the engine's own result (lib/spatial/run/run-test.ts), each test as the engine
 * gave it (its verdict, p-value, curves and pictures), with what the workspace draws around it: the classes
 * in scope, the trench outline, where the finds lie, the heat layers, and the tests on counts by grid square
 * (these still in Loamwork's words, as lib/server/analysis/square-tests.ts words the engine's lattice results).
 * How a test is worded and drawn (verdict words, the sentence to quote, L(r) − r) is worked out on screen by
 * lib/patterns-view. Results stored in the earlier shape are read into this one by
 * lib/server/analysis/former-result.ts, the only place that knows that shape.
 * Plain numbers and arrays only (it is stored as JSON in analysis_runs.result). Types only: safe to
 * import from client components.
 */
import type { EnvelopeOutcome, RunResult as EngineRunResult, TestResult } from "@/lib/spatial";
import type { Correction, SquareTestKind } from "@/lib/schemas/run";

export type ClassInScope = { id: string; code: string; label: string; colour: string; symbol: string; n: number };

type Drawn = "r" | "observed" | "reference" | "excursions" | "fun" | "nsim" | "pValue" | "statistic";

/**
 * A test's curves: the engine's, whole. A run stored before the result was the engine's kept only what was
 * drawn (the curves, the band and where the curve leaves it), so the rest may be absent.
 */
export type StoredCurves = Pick<EnvelopeOutcome, Drawn> & {
  band: Pick<EnvelopeOutcome["band"], "lo" | "hi"> & Partial<EnvelopeOutcome["band"]>;
} & Partial<Omit<EnvelopeOutcome, Drawn | "band">>;

/** One test's result as the engine gave it; classes are named by their code, as the engine was given them. */
export type StoredTest = Omit<TestResult, "curves"> & { curves?: StoredCurves };

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

export type RunResult = Omit<EngineRunResult, "results"> & {
  /** One for each of the run's tests, in its order. */
  results: StoredTest[];
  rmax: number;
  /** The edge correction the run's curves used, shown with the result. */
  correction: Correction;
  outline: [number, number][][];
  /** The classes in scope, in the order the run read them. */
  classes: ClassInScope[];
  density: DensityOut[];
  /** Where each class's finds lie, for the plan overlay. */
  finds: { classId: string; x: number[]; y: number[] }[];
  /** Tests on counts by grid square (absent in runs stored before they existed). */
  squareTests?: SquareTestOut[];
  /** statistics.md's cautions, as the engine words them. */
  cautions: string[];
  elapsedMs: number;
  /** When the engine started and finished (server clock, ms since 1970), to see where a run's time went. */
  timing?: { engineStart: number; engineEnd: number };
};
