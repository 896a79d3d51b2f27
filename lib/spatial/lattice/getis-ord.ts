/**
 * Getis–Ord Gi* (Getis & Ord 1992, Geographical Analysis 24:189–206; Ord & Getis 1995, Geographical
 * Analysis 27:286–306): the standardised local sum of values around square i, the square itself included
 * (weights made with self = true, spdep's include.self). As spdep's localG, the statistic is the z-score
 *   Gi* = (Σ_j w_ij x_j − W_i x̄) / √( s² (n S1i − W_i²) / (n − 1) ),  s² = Σ (x − x̄)² / n,
 *   W_i = Σ_j w_ij, S1i = Σ_j w_ij²  (j running over i and its neighbours).
 * Large positive values mark a hot spot (high values around i), large negative ones a cold spot. The
 * p-value that decides is the conditional permutation one (square i's own value kept; conditional.ts),
 * adjusted across squares for the false discovery rate.
 */
import { conditionalDraws } from "./conditional";
import { benjaminiHochberg } from "./fdr";
import { checkLocal, type LocalTestOptions } from "./local-moran";
import { centred, checkAlternative, checkPermutations, normalP, rankP, type LatticeAlternative } from "./p-values";
import { runSteps, stepEvery, type Steps } from "./steps";
import type { LatticeWeights } from "./types";

export interface GetisOrdResult {
  n: number;
  /** Gi* as a z-score. */
  z: Float64Array;
  /** The local sum Σ_j w_ij x_j over the square and its neighbours. */
  localSum: Float64Array;
  pNormal: Float64Array;
  pPermutation: Float64Array | null;
  pAdjusted: Float64Array;
  /** Mean and variance of the permuted local sums (NaN without permutations), for checks. */
  permutationMean: Float64Array;
  permutationVariance: Float64Array;
  alternative: LatticeAlternative;
  permutations: number;
  seed: number;
}

export function getisOrdStar(
  values: ArrayLike<number>,
  w: LatticeWeights,
  options: Omit<LocalTestOptions, "moments"> = {},
): GetisOrdResult {
  return runSteps(getisOrdSteps(values, w, options), options.onProgress);
}

/** Gi* as steps: yields the fraction of squares done (steps.ts). */
export function* getisOrdSteps(
  values: ArrayLike<number>,
  w: LatticeWeights,
  options: Omit<LocalTestOptions, "moments"> = {},
): Steps<GetisOrdResult> {
  const alternative = options.alternative ?? "two-sided";
  const permutations = options.permutations ?? 999;
  const seed = options.seed ?? 1;
  checkAlternative(alternative);
  checkPermutations(permutations);
  checkLocal(values, w, "Getis–Ord Gi*", true);
  const n = w.n;
  const x = Float64Array.from(values);
  const { m2sum, mean } = centred(x);
  const s2 = m2sum / n;
  let maxAbs = 0;
  for (let i = 0; i < n; i++) maxAbs = Math.max(maxAbs, Math.abs(x[i]));
  const z = new Float64Array(n);
  const localSum = new Float64Array(n);
  const pNormal = new Float64Array(n);
  const pPerm = permutations > 0 ? new Float64Array(n) : null;
  const permMean = new Float64Array(n).fill(NaN);
  const permVar = new Float64Array(n).fill(NaN);
  const pool = new Float64Array(n);
  const every = stepEvery(n);
  for (let i = 0; i < n; i++) {
    if (i > 0 && i % every === 0) yield i / n;
    let lag = 0;
    let Wi = 0;
    let S1i = 0;
    for (let p = w.start[i]; p < w.start[i + 1]; p++) {
      lag += w.weight[p] * x[w.index[p]];
      Wi += w.weight[p];
      S1i += w.weight[p] ** 2;
    }
    localSum[i] = lag;
    z[i] = (lag - Wi * mean) / Math.sqrt((s2 * (n * S1i - Wi * Wi)) / (n - 1));
    pNormal[i] = Number.isFinite(z[i]) ? normalP(z[i], alternative) : 1;
    if (pPerm) {
      const d = conditionalDraws(x, w, i, 1, lag, permutations, seed, pool, maxAbs);
      pPerm[i] = rankP(d.above, d.below, permutations, alternative);
      permMean[i] = d.mean;
      permVar[i] = d.variance;
    }
  }
  return {
    n,
    z,
    localSum,
    pNormal,
    pPermutation: pPerm,
    pAdjusted: benjaminiHochberg(pPerm ?? pNormal),
    permutationMean: permMean,
    permutationVariance: permVar,
    alternative,
    permutations,
    seed,
  };
}
