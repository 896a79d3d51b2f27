/**
 * Local Moran's I (Anselin 1995, Geographical Analysis 27:93–115), a LISA: for each square,
 *   I_i = (z_i / m2) · Σ_j w_ij z_j,  z = x − x̄,  m2 = Σ z² / n
 * with its moments under randomisation as spdep's localmoran: conditional on z_i (the default; Sokal,
 * Oden & Thomson 1998, Geographical Analysis 30:331–354)
 *   E = −z_i² W_i / ((n − 1) m2),  Var = (z_i / m2)² · n/(n − 2) · (W_i2 − W_i² / (n − 1)) · (m2 − z_i² / (n − 1))
 * or over all permutations ("total"; Anselin 1995)
 *   E = −W_i / (n − 1),  Var = A W_i2 + B (W_i² − W_i2) − E²,  A = (n − b2)/(n − 1),  B = (2 b2 − n)/((n − 1)(n − 2))
 * (W_i = Σ_j w_ij, W_i2 = Σ_j w_ij², b2 = m4 / m2²). The p-value that decides is the conditional
 * permutation one (conditional.ts), adjusted across squares for the false discovery rate (fdr.ts).
 * Quadrants as pysal's: high-high (a high square among high ones), low-low, high-low, low-high, from the
 * signs of z_i and of its lag.
 */
import { SpatialInputError } from "../errors";
import { conditionalDraws } from "./conditional";
import { benjaminiHochberg } from "./fdr";
import { centred, checkAlternative, checkPermutations, normalP, rankP, type LatticeAlternative } from "./p-values";
import { runSteps, stepEvery, type StepOptions, type Steps } from "./steps";
import type { LatticeWeights } from "./types";

export interface LocalTestOptions extends StepOptions {
  alternative?: LatticeAlternative;
  /** Conditional permutations per square [999]; 0 for the normal approximation only. */
  permutations?: number;
  seed?: number;
  /** Moments for the z-score: conditional on the square's own value ["conditional"] or over all permutations. */
  moments?: "conditional" | "total";
}

export type Quadrant = "high-high" | "low-low" | "high-low" | "low-high";

export interface LocalMoranResult {
  n: number;
  I: Float64Array;
  expected: Float64Array;
  variance: Float64Array;
  z: Float64Array;
  /** Normal p-value of z. */
  pNormal: Float64Array;
  /** Conditional permutation p-value (null without permutations). */
  pPermutation: Float64Array | null;
  /** Benjamini–Hochberg adjusted p-values of the permutation p (or of the normal p without permutations). */
  pAdjusted: Float64Array;
  quadrant: Quadrant[];
  /** Mean and variance of each square's permuted I_i (NaN without permutations), for checks. */
  permutationMean: Float64Array;
  permutationVariance: Float64Array;
  alternative: LatticeAlternative;
  permutations: number;
  seed: number;
}

export function checkLocal(values: ArrayLike<number>, w: LatticeWeights, test: string, wantSelf: boolean): void {
  if (values.length !== w.n) throw new SpatialInputError(`${values.length} values for ${w.n} squares.`);
  if (w.self !== wantSelf) {
    throw new SpatialInputError(
      wantSelf
        ? `${test} takes weights with each square among its own neighbours (latticeWeights(…, true)).`
        : `${test} takes weights without the square itself among its neighbours.`,
    );
  }
  if (w.n < 3)
    throw new SpatialInputError(`${test} needs at least 3 squares; there ${w.n === 1 ? "is" : "are"} ${w.n}.`);
}

export function localMoran(
  values: ArrayLike<number>,
  w: LatticeWeights,
  options: LocalTestOptions = {},
): LocalMoranResult {
  return runSteps(localMoranSteps(values, w, options), options.onProgress);
}

/** Local Moran's I as steps: yields the fraction of squares done (steps.ts). */
export function* localMoranSteps(
  values: ArrayLike<number>,
  w: LatticeWeights,
  options: LocalTestOptions = {},
): Steps<LocalMoranResult> {
  const alternative = options.alternative ?? "two-sided";
  const permutations = options.permutations ?? 999;
  const seed = options.seed ?? 1;
  const moments = options.moments ?? "conditional";
  checkAlternative(alternative);
  checkPermutations(permutations);
  checkLocal(values, w, "Local Moran's I", false);
  const n = w.n;
  const { z, m2sum } = centred(values);
  const m2 = m2sum / n;
  let m4 = 0;
  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    m4 += z[i] ** 4 / n;
    maxAbs = Math.max(maxAbs, Math.abs(z[i]));
  }
  const b2 = m4 / (m2 * m2);
  const A = (n - b2) / (n - 1);
  const B = (2 * b2 - n) / ((n - 1) * (n - 2));
  const I = new Float64Array(n);
  const expected = new Float64Array(n);
  const variance = new Float64Array(n);
  const zs = new Float64Array(n);
  const pNormal = new Float64Array(n);
  const pPerm = permutations > 0 ? new Float64Array(n) : null;
  const permMean = new Float64Array(n).fill(NaN);
  const permVar = new Float64Array(n).fill(NaN);
  const quadrant: Quadrant[] = [];
  const pool = new Float64Array(n);
  const every = stepEvery(n);
  for (let i = 0; i < n; i++) {
    if (i > 0 && i % every === 0) yield i / n;
    let lag = 0;
    let Wi = 0;
    let Wi2 = 0;
    for (let p = w.start[i]; p < w.start[i + 1]; p++) {
      lag += w.weight[p] * z[w.index[p]];
      Wi += w.weight[p];
      Wi2 += w.weight[p] ** 2;
    }
    const c = z[i] / m2;
    I[i] = c * lag;
    if (moments === "conditional") {
      expected[i] = -(z[i] ** 2 * Wi) / ((n - 1) * m2);
      variance[i] = c * c * (n / (n - 2)) * (Wi2 - (Wi * Wi) / (n - 1)) * (m2 - z[i] ** 2 / (n - 1));
    } else {
      expected[i] = -Wi / (n - 1);
      variance[i] = A * Wi2 + B * (Wi * Wi - Wi2) - expected[i] ** 2;
    }
    zs[i] = (I[i] - expected[i]) / Math.sqrt(variance[i]);
    pNormal[i] = Number.isFinite(zs[i]) ? normalP(zs[i], alternative) : 1;
    quadrant.push(z[i] > 0 ? (lag > 0 ? "high-high" : "high-low") : lag > 0 ? "low-high" : "low-low");
    if (pPerm) {
      const d = conditionalDraws(z, w, i, c, I[i], permutations, seed, pool, maxAbs);
      pPerm[i] = rankP(d.above, d.below, permutations, alternative);
      permMean[i] = d.mean;
      permVar[i] = d.variance;
    }
  }
  return {
    n,
    I,
    expected,
    variance,
    z: zs,
    pNormal,
    pPermutation: pPerm,
    pAdjusted: benjaminiHochberg(pPerm ?? pNormal),
    quadrant,
    permutationMean: permMean,
    permutationVariance: permVar,
    alternative,
    permutations,
    seed,
  };
}
