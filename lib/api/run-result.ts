/**
 * The stored result of a run: the engine's own result (lib/spatial/run/run-test.ts), each test as the engine
 * gave it (its verdict, p-value, curves and pictures), with what the workspace draws around it: the classes
 * in scope, the trench outline, where the finds lie, the heat layers; and each test on counts by grid square
 * as the engine gave it too (lib/spatial/lattice/run-square-test.ts), with the squares it was handed.
 * How a test is worded and drawn (verdict words, the sentence to quote, L(r) − r, a square's hot or cold
 * spot) is worked out on screen by lib/patterns-view. Results stored in the earlier shapes (distribution
 * tests in Loamwork's words; square-count tests in Loamwork's words) are read into this one by
 * lib/server/analysis/former-result.ts, the only place that knows those shapes.
 * Plain numbers and arrays only (it is stored as JSON in analysis_runs.result). Types only: safe to
 * import from client components.
 */
import type {
  EnvelopeOutcome,
  RunResult as EngineRunResult,
  SquareResult,
  SquareTestResult,
  SquareTestSpec,
  TestResult,
} from "@/lib/spatial";
import type { Correction } from "@/lib/schemas/run";

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

/** A grid square named by its label and placed on the plan: its whole square, x0..x1, y0..y1 (m). */
export type PlacedSquare = { label: string; x0: number; y0: number; x1: number; y1: number };

/** A square as the run handed it to a square-count test, placed on the plan (its whole grid square). */
export type SquareUnit = PlacedSquare & {
  /** m² dug in the scope (summed over the records that counted the class) and the class's count summed over them. */
  area: number;
  count: number;
};

type SquareGlobal = NonNullable<SquareTestResult["global"]>;

/**
 * A square-count test's result: the engine's, whole. A run stored before it was the engine's kept the
 * statistic, its expectation and its z under randomisation, and per square no z or normal p, so those may
 * be absent.
 */
export type StoredSquareResult = Omit<SquareTestResult, "global" | "squares"> & {
  global?: Pick<SquareGlobal, "statistic" | "expected"> & {
    z: Pick<SquareGlobal["z"], "randomisation"> & Partial<SquareGlobal["z"]>;
  } & Partial<Pick<SquareGlobal, "variance" | "p">>;
  squares?: (Omit<SquareResult, "z" | "pNormal"> & Partial<Pick<SquareResult, "z" | "pNormal">>)[];
};

/**
 * A test on counts by grid square, for one class (lib/spatial/lattice, through runSquareTest): the squares
 * it was handed and the engine's result with the run's own cautions (squares dug to unequal depth); or, when
 * the engine refused the class (too few squares, all alike), its spec, how many squares it was handed and
 * why. How it is worded and drawn is worked out by lib/patterns-view/square-view.ts.
 */
export type StoredSquareTest = {
  classId: string;
  /** The trench's square size (m). */
  gridSize: number;
} & (
  | { units: SquareUnit[]; result: StoredSquareResult; cautions: string[] }
  | { spec: SquareTestSpec; n: number; refused: string }
);

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
  /** Tests on counts by grid square, one per test and class in scope (absent in runs stored before they existed). */
  squareTests?: StoredSquareTest[];
  /** statistics.md's cautions, as the engine words them. */
  cautions: string[];
  elapsedMs: number;
  /** When the engine started and finished (server clock, ms since 1970), to see where a run's time went. */
  timing?: { engineStart: number; engineEnd: number };
};
