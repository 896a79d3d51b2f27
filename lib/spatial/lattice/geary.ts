/**
 * Geary's C (Geary 1954, The Incorporated Statistician 5:115–145) with its moments under normality and
 * randomisation (Cliff & Ord 1981, Spatial Processes; as spdep's geary.test), and a permutation test.
 * C below 1 means like values side by side (positive autocorrelation), so the standard deviate is
 * (1 − C) / √Var, as spdep has it, and large deviates mean positive autocorrelation.
 *
 *   C = ((n − 1) / (2 S0)) · Σ_ij w_ij (x_i − x_j)² / Σ_i z_i²,  E[C] = 1
 *   Var_N = ((2 S1 + S2)(n − 1) − 4 S0²) / (2 (n + 1) S0²)
 *   Var_R = [(n − 1) S1 (n² − 3n + 3 − (n − 1) b2) − ¼ (n − 1) S2 (n² + 3n − 6 − (n² − n + 2) b2)
 *            + S0² (n² − 3 − (n − 1)² b2)] / (n (n − 2)(n − 3) S0²)
 */
import { normalP, type LatticeAlternative } from "./p-values";
import { globalSetup, permutationP, type GlobalMoments, type GlobalTestOptions, type PairForm } from "./moran";
import type { LatticeWeights } from "./types";
import { runSteps, type Steps } from "./steps";

export interface GearyResult extends GlobalMoments {
  C: number;
  n: number;
  kurtosis: number;
  alternative: LatticeAlternative;
  permutations: number;
  seed: number;
}

/** Σ_ij w_ij (x_i − x_j)². */
function squaredDifferences(f: PairForm, x: Float64Array): number {
  const { i, j, w } = f;
  let s = 0;
  for (let k = 0; k < w.length; k++) {
    const d = x[i[k]] - x[j[k]];
    s += w[k] * d * d;
  }
  return s;
}

export function gearyC(values: ArrayLike<number>, w: LatticeWeights, options: GlobalTestOptions = {}): GearyResult {
  return runSteps(gearySteps(values, w, options), options.onProgress);
}

/** Geary's C as steps: yields the fraction of permutations done (steps.ts). */
export function* gearySteps(
  values: ArrayLike<number>,
  w: LatticeWeights,
  options: GlobalTestOptions = {},
): Steps<GearyResult> {
  const setup = globalSetup(values, w, options, "Geary's C");
  const { alternative, permutations, seed, n, z, m2sum, kurtosis: K, form } = setup;
  const factor = (n - 1) / (2 * w.S0 * m2sum);
  const C = factor * squaredDifferences(form, z);
  const { S0, S1, S2 } = w;
  const S02 = S0 * S0;
  const nn = n * n;
  const n1 = n - 1;
  const varN = ((2 * S1 + S2) * n1 - 4 * S02) / (2 * (n + 1) * S02);
  const varR =
    (n1 * S1 * (nn - 3 * n + 3 - K * n1) -
      0.25 * n1 * S2 * (nn + 3 * n - 6 - K * (nn - n + 2)) +
      S02 * (nn - 3 - K * n1 * n1)) /
    (n * (n - 2) * (n - 3) * S02);
  const zN = (1 - C) / Math.sqrt(varN);
  const zR = (1 - C) / Math.sqrt(varR);
  // Small C is positive autocorrelation.
  const pPerm = yield* permutationP(setup, C, (zp) => factor * squaredDifferences(form, zp), false);
  return {
    C,
    n,
    kurtosis: K,
    expected: 1,
    variance: { normality: varN, randomisation: varR },
    z: { normality: zN, randomisation: zR },
    p: { normality: normalP(zN, alternative), randomisation: normalP(zR, alternative), permutation: pPerm },
    alternative,
    permutations,
    seed,
  };
}
