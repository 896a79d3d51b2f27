/**
 * The binning shared by every K-type estimator: weighted pair counts accumulated on the r grid with
 * spatstat's rule (a pair at distance d counts at r[k] when d < r[k]; see r-grid.ts), and the border
 * (reduced-sample) counts of spatstat's `Kount`.
 */
import type { PairList } from "../geometry/neighbours";
import type { Binning } from "./r-grid";

/**
 * out[k] = Σ_p (weights[2p] + weights[2p+1]) over pairs with bin(d_p) ≤ k when `bothWays`, else Σ weights[p].
 * A missing `weights` means weight 1 each way.
 */
export function cumulativePairSum(
  bin: (d: number) => number,
  m: number,
  pairs: PairList,
  weights: Float64Array | null,
  bothWays: boolean,
  out: Float64Array,
): Float64Array {
  out.fill(0, 0, m);
  for (let p = 0; p < pairs.count; p++) {
    const k = bin(pairs.d[p]);
    if (k >= m) continue;
    const w = weights === null ? (bothWays ? 2 : 1) : bothWays ? weights[2 * p] + weights[2 * p + 1] : weights[p];
    out[k] += w;
  }
  for (let k = 1; k < m; k++) out[k] += out[k - 1];
  return out;
}

/**
 * Reduced-sample counts (Ripley 1977; spatstat `Kount` / `Krect.engine`, see createBinning): numerator[k]
 * counts ordered pairs (i, j) that count at r[k] with centre i, denominator[k] the centres i that count at
 * r[k]. With `bothWays` both ends of a pair are tried as centre (bj: boundary distances of the j pattern,
 * default bi).
 */
export function borderCounts(
  binning: Binning,
  m: number,
  pairs: PairList,
  bi: Float64Array,
  bj: Float64Array | null,
  bothWays: boolean,
  numerator: Float64Array,
  denominator: Float64Array,
): void {
  numerator.fill(0, 0, m);
  denominator.fill(0, 0, m);
  const { bin, lastCentre, needsUncensored, tol } = binning;
  const add = (d: number, b: number): void => {
    if (needsUncensored && d > b + tol) return; // censored: the circle of radius d leaves the window
    const k = bin(d);
    const last = lastCentre(b);
    if (k >= m || last < k) return;
    numerator[k] += 1;
    if (last + 1 < m) numerator[last + 1] -= 1;
  };
  for (let p = 0; p < pairs.count; p++) {
    const d = pairs.d[p];
    add(d, bi[pairs.i[p]]);
    if (bothWays) add(d, (bj ?? bi)[pairs.j[p]]);
  }
  for (let k = 1; k < m; k++) numerator[k] += numerator[k - 1];
  for (let i = 0; i < bi.length; i++) {
    const last = lastCentre(bi[i]);
    if (last >= 0) denominator[last] += 1;
  }
  for (let k = m - 2; k >= 0; k--) denominator[k] += denominator[k + 1];
}
