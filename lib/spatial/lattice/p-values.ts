/**
 * The p-values of the square-count tests. Alternatives are named for what they look for: "positive"
 * (like values side by side: clustering, hot spots), "negative" (unlike values side by side), or
 * "two-sided" (either; the default).
 */
import jStat from "../random/jstat-typed";
import { SpatialInputError } from "../errors";

export type LatticeAlternative = "positive" | "negative" | "two-sided";

/** Upper normal tail P(Z > z), accurate in relative terms well into the tail (jStat's erfc). */
export function normalUpper(z: number): number {
  return 0.5 * (jStat as unknown as { erfc(x: number): number }).erfc(z / Math.SQRT2);
}

/** Normal p-value of a standard deviate whose large values mean positive autocorrelation. */
export function normalP(z: number, alternative: LatticeAlternative): number {
  if (alternative === "positive") return normalUpper(z);
  if (alternative === "negative") return normalUpper(-z);
  return Math.min(1, 2 * normalUpper(Math.abs(z)));
}

/**
 * Monte Carlo p-values from counts of simulated statistics at least as large (`above`) and at most as large
 * (`below`) as the observed one, out of `s`: p = (1 + #{T_sim ≥ T_obs}) / (s + 1) (Besag & Diggle 1977;
 * Cliff & Ord 1981), the two-sided one twice the smaller tail, capped at 1. `positiveIsLarge` says whether a
 * large statistic means positive autocorrelation (Moran's I, Gi*) or not (Geary's C).
 */
export function rankP(
  above: number,
  below: number,
  s: number,
  alternative: LatticeAlternative,
  positiveIsLarge = true,
): number {
  const pHigh = (1 + above) / (s + 1);
  const pLow = (1 + below) / (s + 1);
  if (alternative === "two-sided") return Math.min(1, 2 * Math.min(pHigh, pLow));
  return (alternative === "positive") === positiveIsLarge ? pHigh : pLow;
}

/**
 * Whether a permuted statistic ties the observed one: sums of the same numbers in another order differ in
 * the last bits, and counts tie often, so "equal" is within 1e-10 of the statistic's scale.
 */
export function tieTolerance(scale: number): number {
  return 1e-10 * Math.max(Math.abs(scale), Number.MIN_VALUE);
}

export function checkPermutations(permutations: number): void {
  if (!Number.isInteger(permutations) || permutations < 0 || permutations > 1_000_000) {
    throw new SpatialInputError(
      `The number of permutations must be a whole number from 0 to 1,000,000; got ${permutations}.`,
    );
  }
}

export function checkAlternative(a: unknown): asserts a is LatticeAlternative {
  if (a !== "positive" && a !== "negative" && a !== "two-sided") {
    throw new SpatialInputError(`The alternative must be "positive", "negative" or "two-sided"; got ${String(a)}.`);
  }
}

/** Centred values z = x − x̄ and Σz², refusing a variable with no variation. */
export function centred(values: ArrayLike<number>): { z: Float64Array; m2sum: number; mean: number } {
  const n = values.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += values[i];
  mean /= n;
  const z = new Float64Array(n);
  let m2sum = 0;
  for (let i = 0; i < n; i++) {
    z[i] = values[i] - mean;
    m2sum += z[i] * z[i];
  }
  if (!(m2sum > 1e-24 * Math.max(1, mean * mean) * n)) {
    throw new SpatialInputError(
      "Every square has the same value: with no variation between squares there is nothing to test.",
    );
  }
  return { z, m2sum, mean };
}
