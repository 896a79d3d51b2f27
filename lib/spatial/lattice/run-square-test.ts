/**
 * One square-count test from start to verdict: the squares as recorded → units and neighbours (lattice.ts)
 * → weights → the statistic with its p-values → verdict and cautions. What the app, a worker and the
 * command line call; the result is plain JSON.
 */
import { buildLattice } from "./lattice";
import { gearySteps } from "./geary";
import { getisOrdSteps } from "./getis-ord";
import { localMoranSteps } from "./local-moran";
import { moranSteps } from "./moran";
import { parseSquareTestSpec, type SquareTestSpec } from "./square-test-spec";
import {
  globalVerdict,
  localSummary,
  squareCautions,
  SQUARE_NULL,
  type SquareClass,
  type SquareVerdict,
} from "./square-verdict";
import { runSteps, runStepsAsync, type AsyncStepOptions, type StepOptions, type Steps } from "./steps";
import { latticeWeights } from "./weights";
import type { LatticeInput, LeftOutSquare } from "./types";

export interface SquareResult {
  id: string;
  /** The variable tested (density per m² or count). */
  value: number;
  /** Local I_i, or Gi* (a z-score). */
  statistic: number;
  z: number;
  pNormal: number;
  p: number;
  pAdjusted: number;
  class: SquareClass;
}

export interface SquareTestResult {
  spec: SquareTestSpec;
  test: string;
  nullName: string;
  verdict: SquareVerdict;
  summary: string;
  cautions: string[];
  n: number;
  leftOut: LeftOutSquare[];
  neighbours: string;
  /** The p-value the verdict rests on, and where it comes from. */
  p: number;
  pFrom: "permutation" | "randomisation" | "normal";
  /** Global tests: the statistic and its analytical moments. */
  global?: {
    statistic: number;
    expected: number;
    variance: { normality: number; randomisation: number };
    z: { normality: number; randomisation: number };
    p: { normality: number; randomisation: number; permutation: number | null };
  };
  /** Local tests: one row per square. */
  squares?: SquareResult[];
}

const NAMES = {
  moran: "Moran's I",
  geary: "Geary's C",
  "local-moran": "local Moran's I",
  "getis-ord": "Getis–Ord Gi*",
} as const;

export function runSquareTest(input: LatticeInput, specInput: unknown, options: StepOptions = {}): SquareTestResult {
  return runSteps(squareTestSteps(input, specInput), options.onProgress);
}

/**
 * The same test, giving the event loop a turn between steps: what a run in the app's own process calls, so
 * that its progress is written and a cancellation noticed while the permutations go on.
 */
export function runSquareTestAsync(
  input: LatticeInput,
  specInput: unknown,
  options: AsyncStepOptions = {},
): Promise<SquareTestResult> {
  return runStepsAsync(squareTestSteps(input, specInput), options);
}

/** The test as steps: yields the fraction of its permutations (global) or squares (local) done. */
export function* squareTestSteps(input: LatticeInput, specInput: unknown): Steps<SquareTestResult> {
  const spec = parseSquareTestSpec(specInput);
  const lattice = buildLattice(input, {
    neighbours: spec.neighbours,
    variable: spec.variable,
    minArea: spec.minArea,
    isolated: spec.isolated,
  });
  const test = NAMES[spec.type];
  const opts = { alternative: spec.alternative, permutations: spec.permutations, seed: spec.seed };
  const common = {
    spec,
    test,
    nullName: SQUARE_NULL,
    n: lattice.ids.length,
    leftOut: lattice.leftOut,
    neighbours: lattice.describe,
  };
  const weightWords = spec.style === "row" ? "row-standardised weights" : "binary weights";

  if (spec.type === "moran" || spec.type === "geary") {
    const w = latticeWeights(lattice.neighbours, spec.style);
    const r =
      spec.type === "moran" ? yield* moranSteps(lattice.values, w, opts) : yield* gearySteps(lattice.values, w, opts);
    const statistic = "I" in r ? r.I : r.C;
    const pFrom = r.p.permutation === null ? "randomisation" : "permutation";
    const p = r.p.permutation ?? r.p.randomisation;
    const positive = spec.type === "moran" ? statistic > r.expected : statistic < 1;
    const symbol = spec.type === "moran" ? "I" : "C";
    const words = `${symbol} = ${statistic.toPrecision(3)} against ${r.expected.toPrecision(3)} expected, ${lattice.describe}, ${weightWords}, ${pFrom === "permutation" ? `${spec.permutations} permutations, seed ${spec.seed}` : "normal approximation under randomisation"}`;
    const v = globalVerdict(test, p, spec.level, positive, words);
    return {
      ...common,
      ...v,
      cautions: squareCautions(spec, lattice, false),
      p,
      pFrom,
      global: { statistic, expected: r.expected, variance: r.variance, z: r.z, p: r.p },
    };
  }

  const star = spec.type === "getis-ord";
  const w = latticeWeights(lattice.neighbours, spec.style, star);
  const r = star ? yield* getisOrdSteps(lattice.values, w, opts) : yield* localMoranSteps(lattice.values, w, opts);
  const pRaw = r.pPermutation ?? r.pNormal;
  const squares: SquareResult[] = lattice.ids.map((id, i) => {
    let cls: SquareClass = "none";
    if (r.pAdjusted[i] <= spec.level) {
      if ("quadrant" in r) {
        const q = r.quadrant[i];
        cls =
          q === "high-high"
            ? "hot spot"
            : q === "low-low"
              ? "cold spot"
              : q === "high-low"
                ? "high among low"
                : "low among high";
      } else cls = r.z[i] > 0 ? "hot spot" : "cold spot";
    }
    return {
      id,
      value: lattice.values[i],
      statistic: "I" in r ? r.I[i] : r.z[i],
      z: r.z[i],
      pNormal: r.pNormal[i],
      p: pRaw[i],
      pAdjusted: r.pAdjusted[i],
      class: cls,
    };
  });
  const classes = squares.map((s) => s.class);
  const found = classes.filter((c) => c !== "none").length;
  const raw = squares.filter((s) => s.p <= spec.level).length;
  const minAdjusted = Math.min(...squares.map((s) => s.pAdjusted));
  return {
    ...common,
    verdict: found > 0 ? "hot or cold spots" : "no evidence against the null",
    summary:
      localSummary(test, classes, raw, spec.level) +
      ` ${lattice.describe}, ${weightWords}, ${r.pPermutation ? `${spec.permutations} conditional permutations per square, seed ${spec.seed}` : "normal approximation"}.`,
    cautions: squareCautions(spec, lattice, true),
    p: minAdjusted,
    pFrom: r.pPermutation ? "permutation" : "normal",
    squares,
  };
}
