/**
 * Ripley's K function (Ripley 1976, J. Appl. Prob. 13:255–266; 1977, JRSS B 39:172–212) and Besag's
 * L = √(K/π) (Besag 1977, discussion of Ripley 1977), with spatstat 3.x conventions:
 *   K̂(r) = |W| / (n(n−1)) · Σ_{i≠j} w_ij · 1{d_ij < r}     (isotropic, translation)
 *   K̂(r) = Σ_{i≠j} 1{d_ij < r, d_ij ≤ b_i, b_i ≥ r⁻} / (λ · #{i: b_i ≥ r⁻})   (border, r⁻ the previous grid value;
 *          NaN where no i has b_i ≥ r⁻, as spatstat's NA)
 * with λ = n/|W| (in a rectangle on an even grid, spatstat's `Krect.engine` rule instead: see createBinning). Edge
 * weights: isotropic (Ripley 1977) in edge-isotropic.ts, translation (Ohser 1983) in
 * edge-translation.ts.
 */
import { borderCounts, cumulativePairSum } from "./k-accumulate";
import { isotropicPairWeights } from "../geometry/edge-isotropic";
import { translationPairWeights } from "../geometry/edge-translation";
import { pairsWithin, type PairList } from "../geometry/neighbours";
import { checkPattern } from "../geometry/pattern";
import { checkRGrid, createBinning, defaultRGrid } from "./r-grid";
import { SpatialInputError } from "../errors";
import type { KCorrection, PointsInput, Window } from "../types";

export interface KOptions {
  /**
   * Distances; default the spatstat grid of r-grid.ts for every correction (the border estimate is NaN
   * beyond the r where no point is deep enough, as spatstat's NA).
   */
  r?: ArrayLike<number>;
  /** Edge corrections to compute (default ["isotropic"]). */
  correction?: KCorrection | KCorrection[];
  /** Pairs with d ≤ max(r), if already enumerated (e.g. by pair-grid.ts); otherwise found here. */
  pairs?: PairList;
  /** Name of the pattern in error messages. */
  label?: string;
}

export interface KResult {
  r: Float64Array;
  /** πr², the value under CSR. */
  theo: Float64Array;
  n: number;
  area: number;
  lambda: number;
  K: Partial<Record<KCorrection, Float64Array>>;
}

export interface LResult extends Omit<KResult, "K"> {
  L: Partial<Record<KCorrection, Float64Array>>;
}

export function corrections(c: KCorrection | KCorrection[] | undefined): KCorrection[] {
  const list = c === undefined ? ["isotropic"] : Array.isArray(c) ? c : [c];
  for (const name of list) {
    if (name !== "isotropic" && name !== "translation" && name !== "border") {
      throw new SpatialInputError(`Unknown edge correction "${String(name)}"; use isotropic, translation or border.`);
    }
  }
  if (list.length === 0) throw new SpatialInputError("Choose at least one edge correction.");
  return [...new Set(list)] as KCorrection[];
}

/**
 * Border-corrected ratio. Where no point lies far enough from the edge to count as a centre, the estimate
 * does not exist and the value is NaN (spatstat's NA): the curve is defined from r = 0 up to some r and
 * undefined beyond (see `definedLength`).
 */
export function borderRatio(numerator: Float64Array, denominator: Float64Array, lambda: number): Float64Array {
  const out = new Float64Array(numerator.length);
  for (let k = 0; k < out.length; k++)
    out[k] = denominator[k] === 0 ? Number.NaN : numerator[k] / (lambda * denominator[k]);
  return out;
}

/** Number of leading values of a curve that are defined (finite): the curve is defined on r[0 .. length−1]. */
export function definedLength(curve: ArrayLike<number>, offset = 0, m = curve.length - offset): number {
  for (let k = 0; k < m; k++) if (!Number.isFinite(curve[offset + k])) return k;
  return m;
}

/** Boundary distance of every point. */
export function boundaryDistances(window: Window, x: Float64Array, y: Float64Array): Float64Array {
  const b = new Float64Array(x.length);
  for (let k = 0; k < x.length; k++) b[k] = window.boundaryDistance(x[k], y[k]);
  return b;
}

/** K̂(r) of one pattern in W under the chosen edge corrections. */
export function kFunction(window: Window, points: PointsInput, options: KOptions = {}): KResult {
  const label = options.label ?? "the finds";
  const { x, y } = checkPattern(window, points, { label });
  const n = x.length;
  const wanted = corrections(options.correction);
  const r = options.r ? checkRGrid(window, options.r) : defaultRGrid(window, n);
  const m = r.length;
  const rmax = r[m - 1];
  const pairs = options.pairs ?? pairsWithin({ x, y }, rmax);
  const binning = createBinning(window, r);
  const lambda = n / window.area;
  const scale = window.area / (n * (n - 1));
  const K: KResult["K"] = {};
  for (const c of wanted) {
    if (c === "border") {
      const b = boundaryDistances(window, x, y);
      const num = new Float64Array(m);
      const den = new Float64Array(m);
      borderCounts(binning, m, pairs, b, null, true, num, den);
      K.border = borderRatio(num, den, lambda);
      continue;
    }
    const weights =
      c === "isotropic"
        ? isotropicPairWeights(window, x, y, n, pairs, rmax)
        : translationPairWeights(window, x, y, x, y, pairs);
    const sum = cumulativePairSum(binning.bin, m, pairs, weights, c === "isotropic", new Float64Array(m));
    // translation weights are symmetric: one per unordered pair, counted for both orders
    const factor = c === "isotropic" ? scale : 2 * scale;
    for (let k = 0; k < m; k++) sum[k] *= factor;
    K[c] = sum;
  }
  const theo = new Float64Array(m);
  for (let k = 0; k < m; k++) theo[k] = Math.PI * r[k] * r[k];
  return { r, theo, n, area: window.area, lambda, K };
}

/** L = √(K/π), column by column (Besag 1977). */
export function kToL(K: Float64Array): Float64Array {
  const L = new Float64Array(K.length);
  for (let k = 0; k < K.length; k++) L[k] = Math.sqrt(Math.max(0, K[k]) / Math.PI);
  return L;
}

/** Besag's L̂(r) = √(K̂(r)/π); theo is then r itself. */
export function lFunction(window: Window, points: PointsInput, options: KOptions = {}): LResult {
  const { K, ...rest } = kFunction(window, points, options);
  const L: LResult["L"] = {};
  for (const [c, values] of Object.entries(K) as [KCorrection, Float64Array][]) L[c] = kToL(values);
  return { ...rest, theo: Float64Array.from(rest.r), L };
}
