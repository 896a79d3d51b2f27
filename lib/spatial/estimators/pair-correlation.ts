/**
 * Pair correlation function g(r) = K′(r) / (2πr) by kernel smoothing of the pair distances (Stoyan &
 * Stoyan 1994, Fractals, Random Shapes and Point Fields, §15.4):
 *   ĝ(r) = |W| / (2π r n(n−1)) · Σ_{i≠j} w_ij · k_h(r − d_ij),
 * Epanechnikov kernel k_h(u) = 0.75 (1 − (u/h)²) / h on |u| < h, half-width h = 0.15/√λ (Stoyan's rule),
 * divisor r, isotropic or translation weights. The kernel sum is exact (spatstat's `pcf.ppp` bins it
 * through an FFT density instead; see statistics.md).
 */
import { isotropicPairWeights } from "../geometry/edge-isotropic";
import { translationPairWeights } from "../geometry/edge-translation";
import { corrections } from "./k-function";
import { pairsWithin } from "../geometry/neighbours";
import { checkPattern } from "../geometry/pattern";
import { checkRGrid, defaultRGrid } from "./r-grid";
import { SpatialInputError } from "../errors";
import type { KCorrection, PointsInput, Window } from "../types";

export interface PairCorrelationOptions {
  /** Distances; a leading 0 is dropped (g is undefined there). Default: the K grid of r-grid.ts without 0. */
  r?: ArrayLike<number>;
  /** "isotropic" and/or "translation" (default ["isotropic"]). */
  correction?: KCorrection | KCorrection[];
  /** Kernel half-width in metres; default Stoyan's 0.15/√λ. */
  halfWidth?: number;
  label?: string;
}

export interface PairCorrelationResult {
  /** The r values evaluated: all positive. */
  r: Float64Array;
  /** 1 under CSR. */
  theo: Float64Array;
  halfWidth: number;
  lambda: number;
  g: Partial<Record<KCorrection, Float64Array>>;
}

export function pairCorrelation(
  window: Window,
  points: PointsInput,
  options: PairCorrelationOptions = {},
): PairCorrelationResult {
  const label = options.label ?? "the finds";
  const { x, y } = checkPattern(window, points, { label });
  const n = x.length;
  const full = options.r ? checkRGridAllowPositive(window, options.r) : defaultRGrid(window, n);
  const r = full[0] === 0 ? full.subarray(1).slice() : full;
  const m = r.length;
  const lambda = n / window.area;
  const h = options.halfWidth ?? 0.15 / Math.sqrt(lambda);
  if (!(h > 0) || !Number.isFinite(h))
    throw new SpatialInputError(`The kernel half-width must be a positive distance; got ${h}.`);
  const wanted = corrections(options.correction);
  if (wanted.includes("border"))
    throw new SpatialInputError("The pair correlation takes the isotropic or translation correction, not border.");
  const reach = Math.min(r[m - 1] + h, window.diameter);
  const pairs = pairsWithin({ x, y }, reach);
  const g: PairCorrelationResult["g"] = {};
  for (const c of wanted) {
    const iso = c === "isotropic";
    const w = iso
      ? isotropicPairWeights(window, x, y, n, pairs, reach)
      : translationPairWeights(window, x, y, x, y, pairs);
    const sum = new Float64Array(m);
    for (let p = 0; p < pairs.count; p++) {
      const d = pairs.d[p];
      const weight = iso ? w[2 * p] + w[2 * p + 1] : 2 * w[p];
      // first grid value above d − h (binary search), then every value below d + h
      let lo = 0;
      let hi = m;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (r[mid] > d - h) hi = mid;
        else lo = mid + 1;
      }
      for (let k = lo; k < m && r[k] < d + h; k++) {
        const u = (r[k] - d) / h;
        sum[k] += (weight * 0.75 * (1 - u * u)) / h;
      }
    }
    const scale = window.area / (2 * Math.PI * n * (n - 1));
    for (let k = 0; k < m; k++) sum[k] *= scale / r[k];
    g[c] = sum;
  }
  return { r, theo: new Float64Array(m).fill(1), halfWidth: h, lambda, g };
}

/** Like checkRGrid, but a grid may also start above 0. */
function checkRGridAllowPositive(window: Window, input: ArrayLike<number>): Float64Array {
  const values = Float64Array.from(input);
  if (values.length > 0 && values[0] > 0) {
    const withZero = new Float64Array(values.length + 1);
    withZero.set(values, 1);
    return checkRGrid(window, withZero).subarray(1).slice();
  }
  return checkRGrid(window, values);
}
