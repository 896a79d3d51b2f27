/**
 * Inhomogeneous K (Baddeley, Møller & Waagepetersen 2000, Stat. Neerl. 54:329–350):
 *   K̂_inhom(r) = (1/D) · Σ_{i≠j} w_ij / (λ(x_i) λ(x_j)) · 1{d_ij < r},
 * with D = |W| (spatstat `Kinhom(renormalise = FALSE)`) or, by default as in spatstat, D = Σ_i 1/λ(x_i):
 * spatstat's renormalisation (default normpower 1), which rescales the estimate as if Σ 1/λ̂(x_i) were |W|. λ comes
 * from the caller (e.g. a
 * fitted trend) or from the leave-one-out Gaussian kernel of intensity.ts, whose bandwidth rule is stated
 * there. Isotropic or translation weights; same binning rules as K (r-grid.ts).
 */
import { cumulativePairSum } from "./k-accumulate";
import { isotropicPairWeights } from "../geometry/edge-isotropic";
import { translationPairWeights } from "../geometry/edge-translation";
import { corrections, kToL } from "./k-function";
import { pairsWithin } from "../geometry/neighbours";
import { checkPattern } from "../geometry/pattern";
import { checkRGrid, createBinning, defaultRGrid } from "./r-grid";
import { intensityAtPoints, type PointIntensityOptions } from "./intensity";
import { SpatialInputError } from "../errors";
import type { KCorrection, PointsInput, Window } from "../types";

export interface KInhomOptions {
  r?: ArrayLike<number>;
  /** "isotropic" and/or "translation" (default ["isotropic"]). */
  correction?: KCorrection | KCorrection[];
  /** λ(x_i) for each find, finds per m²; otherwise estimated with `intensity`. */
  lambda?: ArrayLike<number>;
  /** Kernel options when λ is estimated (default: Scott's σ, uniform edge correction, leave-one-out). */
  intensity?: PointIntensityOptions;
  /** Divide by Σ 1/λ_i instead of |W| (default true, as spatstat). */
  renormalise?: boolean;
  label?: string;
}

export interface KInhomResult {
  r: Float64Array;
  theo: Float64Array;
  lambda: Float64Array;
  /** σ of the kernel when λ was estimated here. */
  sigma: number | null;
  K: Partial<Record<KCorrection, Float64Array>>;
  L: Partial<Record<KCorrection, Float64Array>>;
}

export function kInhom(window: Window, points: PointsInput, options: KInhomOptions = {}): KInhomResult {
  const label = options.label ?? "the finds";
  const p = checkPattern(window, points, { label });
  const n = p.x.length;
  let lambda: Float64Array;
  let sigma: number | null = null;
  if (options.lambda) {
    lambda = Float64Array.from(options.lambda);
    if (lambda.length !== n) throw new SpatialInputError(`${n} finds but ${lambda.length} intensity values.`);
    lambda.forEach((v, k) => {
      if (!(v > 0) || !Number.isFinite(v))
        throw new SpatialInputError(`The intensity at find ${k + 1} must be positive; got ${v}.`);
    });
  } else {
    const est = intensityAtPoints(window, p, { leaveOneOut: true, ...options.intensity, label });
    lambda = est.values;
    sigma = est.sigma;
  }
  const wanted = corrections(options.correction);
  if (wanted.includes("border"))
    throw new SpatialInputError("Inhomogeneous K takes the isotropic or translation correction, not border.");
  const r = options.r ? checkRGrid(window, options.r) : defaultRGrid(window, n);
  const m = r.length;
  const pairs = pairsWithin(p, r[m - 1]);
  const binning = createBinning(window, r);
  let divisor = window.area;
  if (options.renormalise ?? true) {
    divisor = 0;
    for (let k = 0; k < n; k++) divisor += 1 / lambda[k];
  }
  const K: KInhomResult["K"] = {};
  const L: KInhomResult["L"] = {};
  for (const c of wanted) {
    const iso = c === "isotropic";
    const w = iso
      ? isotropicPairWeights(window, p.x, p.y, n, pairs, r[m - 1])
      : translationPairWeights(window, p.x, p.y, p.x, p.y, pairs);
    // fold 1/(λ_i λ_j) into the weights; translation weights count both orders
    const folded = new Float64Array(iso ? 2 * pairs.count : pairs.count);
    for (let q = 0; q < pairs.count; q++) {
      const inv = 1 / (lambda[pairs.i[q]] * lambda[pairs.j[q]]);
      if (iso) {
        folded[2 * q] = w[2 * q] * inv;
        folded[2 * q + 1] = w[2 * q + 1] * inv;
      } else folded[q] = 2 * w[q] * inv;
    }
    const sum = cumulativePairSum(binning.bin, m, pairs, folded, iso, new Float64Array(m));
    for (let k = 0; k < m; k++) sum[k] /= divisor;
    K[c] = sum;
    L[c] = kToL(sum);
  }
  return { r, theo: r.map((v) => Math.PI * v * v), lambda, sigma, K, L };
}
