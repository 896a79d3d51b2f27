/**
 * Global Moran's I (Moran 1950, Biometrika 37:17–23) with its moments under normality and under
 * randomisation (Cliff & Ord 1981, Spatial Processes, pp. 21 and 47; as spdep's moran.test), and a
 * permutation test: the values permuted over the squares, I recomputed,
 * p = (1 + #{I_sim ≥ I_obs}) / (s + 1) (Cliff & Ord 1981; Besag & Diggle 1977).
 *
 *   I = (n / S0) · Σ_ij w_ij z_i z_j / Σ_i z_i²,  z = x − x̄,  E[I] = −1 / (n − 1)
 *   Var_N = (n² S1 − n S2 + 3 S0²) / (S0² (n² − 1)) − E[I]²
 *   Var_R = [n ((n² − 3n + 3) S1 − n S2 + 3 S0²) − b2 ((n² − n) S1 − 2n S2 + 6 S0²)]
 *           / ((n − 1)(n − 2)(n − 3) S0²) − E[I]²,  b2 = n Σz⁴ / (Σz²)²
 */
import { createUint32Stream } from "../random/random";
import { uniformIndex } from "./conditional";
import { SpatialInputError } from "../errors";
import {
  centred,
  checkAlternative,
  checkPermutations,
  normalP,
  rankP,
  tieTolerance,
  type LatticeAlternative,
} from "./p-values";
import { runSteps, stepEvery, type StepOptions, type Steps } from "./steps";
import type { LatticeWeights } from "./types";

export interface GlobalTestOptions extends StepOptions {
  alternative?: LatticeAlternative;
  /** Permutations for the Monte Carlo p-value [999]; 0 for the analytical p-values only. */
  permutations?: number;
  /** Seed of the permutations [1]; permutation s draws from stream s of this seed. */
  seed?: number;
}

export interface GlobalMoments {
  expected: number;
  variance: { normality: number; randomisation: number };
  z: { normality: number; randomisation: number };
  p: { normality: number; randomisation: number; permutation: number | null };
}

export interface MoranResult extends GlobalMoments {
  I: number;
  n: number;
  /** Sample kurtosis b2 = n Σz⁴ / (Σz²)². */
  kurtosis: number;
  alternative: LatticeAlternative;
  permutations: number;
  seed: number;
}

export function checkGlobal(values: ArrayLike<number>, w: LatticeWeights, test: string): void {
  if (values.length !== w.n) throw new SpatialInputError(`${values.length} values for ${w.n} squares.`);
  if (w.self) throw new SpatialInputError(`${test} takes weights without the square itself among its neighbours.`);
  if (w.n < 4)
    throw new SpatialInputError(
      `${test} needs at least 4 squares with neighbours; there ${w.n === 1 ? "is" : "are"} ${w.n}.`,
    );
}

/**
 * The weights as unordered pairs i < j with weight w_ij + w_ji: a quadratic form Σ_ij w_ij a_i a_j (or
 * Σ_ij w_ij (a_i − a_j)²) then takes half the terms, which is most of a permutation's cost.
 */
export interface PairForm {
  i: Int32Array;
  j: Int32Array;
  w: Float64Array;
}

export function pairForm(w: LatticeWeights): PairForm {
  const count = w.start[w.n];
  const pi = new Int32Array(count);
  const pj = new Int32Array(count);
  const pw = new Float64Array(count);
  let k = 0;
  for (let i = 0; i < w.n; i++) {
    for (let p = w.start[i]; p < w.start[i + 1]; p++) {
      const j = w.index[p];
      if (j <= i) continue;
      // w_ji: row j's entry for i (the neighbour structure is symmetric)
      let wji = 0;
      for (let q = w.start[j]; q < w.start[j + 1]; q++) if (w.index[q] === i) wji = w.weight[q];
      pi[k] = i;
      pj[k] = j;
      pw[k] = w.weight[p] + wji;
      k++;
    }
  }
  return { i: pi.subarray(0, k), j: pj.subarray(0, k), w: pw.subarray(0, k) };
}

/** Σ_ij w_ij z_i z_j. */
function crossSum(f: PairForm, z: Float64Array): number {
  const { i, j, w } = f;
  let s = 0;
  for (let k = 0; k < w.length; k++) s += w[k] * z[i[k]] * z[j[k]];
  return s;
}

/** Shuffle `into` from `from` with a Fisher–Yates draw of stream `stream`. */
export function permuteInto(from: Float64Array, into: Float64Array, seed: number, stream: number): void {
  into.set(from);
  const u32 = createUint32Stream(seed, stream);
  for (let i = into.length - 1; i > 0; i--) {
    const j = uniformIndex(u32, i + 1);
    const t = into[i];
    into[i] = into[j];
    into[j] = t;
  }
}

/** What both global tests start from: the options with their defaults, checked input, centred values. */
export function globalSetup(values: ArrayLike<number>, w: LatticeWeights, options: GlobalTestOptions, test: string) {
  const alternative = options.alternative ?? "two-sided";
  const permutations = options.permutations ?? 999;
  const seed = options.seed ?? 1;
  checkAlternative(alternative);
  checkPermutations(permutations);
  checkGlobal(values, w, test);
  const n = w.n;
  const { z, m2sum } = centred(values);
  let z4 = 0;
  for (let i = 0; i < n; i++) z4 += z[i] ** 4;
  /** Sample kurtosis b2 = n Σz⁴ / (Σz²)². */
  const kurtosis = (n * z4) / (m2sum * m2sum);
  return { alternative, permutations, seed, n, z, m2sum, kurtosis, form: pairForm(w) };
}

/**
 * The permutation p-value of a global statistic: the values permuted over the squares (permutation s from
 * stream s of the seed), the statistic recomputed, ties within rounding counted on both sides; null with no
 * permutations. Yields the fraction done. `largeIsPositive` says which tail is positive autocorrelation.
 */
export function* permutationP(
  setup: Pick<ReturnType<typeof globalSetup>, "alternative" | "permutations" | "seed" | "n" | "z">,
  observed: number,
  statistic: (permuted: Float64Array) => number,
  largeIsPositive = true,
): Steps<number | null> {
  const { alternative, permutations, seed, n, z } = setup;
  if (permutations === 0) return null;
  const zp = new Float64Array(n);
  const eps = tieTolerance(observed);
  let above = 0;
  let below = 0;
  const every = stepEvery(permutations);
  for (let s = 0; s < permutations; s++) {
    if (s > 0 && s % every === 0) yield s / permutations;
    permuteInto(z, zp, seed, s);
    const sim = statistic(zp);
    if (sim >= observed - eps) above++;
    if (sim <= observed + eps) below++;
  }
  return rankP(above, below, permutations, alternative, largeIsPositive);
}

export function moranI(values: ArrayLike<number>, w: LatticeWeights, options: GlobalTestOptions = {}): MoranResult {
  return runSteps(moranSteps(values, w, options), options.onProgress);
}

/** Moran's I as steps: yields the fraction of permutations done (steps.ts). */
export function* moranSteps(
  values: ArrayLike<number>,
  w: LatticeWeights,
  options: GlobalTestOptions = {},
): Steps<MoranResult> {
  const setup = globalSetup(values, w, options, "Moran's I");
  const { alternative, permutations, seed, n, z, m2sum, kurtosis, form } = setup;
  const factor = n / (w.S0 * m2sum);
  const I = factor * crossSum(form, z);
  const { S0, S1, S2 } = w;
  const S02 = S0 * S0;
  const nn = n * n;
  const expected = -1 / (n - 1);
  const varN = (nn * S1 - n * S2 + 3 * S02) / (S02 * (nn - 1)) - expected * expected;
  const varR =
    (n * (S1 * (nn - 3 * n + 3) - n * S2 + 3 * S02) - kurtosis * (S1 * (nn - n) - 2 * n * S2 + 6 * S02)) /
      ((n - 1) * (n - 2) * (n - 3) * S02) -
    expected * expected;
  const zN = (I - expected) / Math.sqrt(varN);
  const zR = (I - expected) / Math.sqrt(varR);
  const pPerm = yield* permutationP(setup, I, (zp) => factor * crossSum(form, zp));
  return {
    I,
    n,
    kurtosis,
    expected,
    variance: { normality: varN, randomisation: varR },
    z: { normality: zN, randomisation: zR },
    p: { normality: normalP(zN, alternative), randomisation: normalP(zR, alternative), permutation: pPerm },
    alternative,
    permutations,
    seed,
  };
}
