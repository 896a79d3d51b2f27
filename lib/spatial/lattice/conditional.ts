/**
 * Conditional permutation for local statistics (Anselin 1995, Geographical Analysis 27:93–115): the value
 * of square i stays where it is and the other n − 1 values are permuted over the other squares, so square
 * i's neighbours receive a random draw, without replacement, of the others' values. Only the neighbours'
 * draws matter, so each simulation is a partial Fisher–Yates shuffle of length |N(i)|. Square i draws from
 * stream i of the seed, which gives the same numbers whichever squares are computed, and in any order.
 * (spdep 1.2-7's localmoran_perm and localG_perm draw with replacement, and its Gi* draws the square's own
 * value as well; Loamwork follows Anselin's definition.)
 */
import { createUint32Stream } from "../random/random";
import type { LatticeWeights } from "./types";

/**
 * A uniform integer in 0 .. m − 1 from 32-bit draws, exactly (Lemire 2019, ACM TOMACS 29:3, "Fast random
 * integer generation in an interval": multiply and shift, rejecting the few low products that would bias
 * it). m up to 2^21, so that the product is exact in a double.
 */
export function uniformIndex(u32: () => number, m: number): number {
  for (;;) {
    const prod = u32() * m;
    const hi = Math.floor(prod / 4294967296);
    const lo = prod - hi * 4294967296;
    if (lo >= m || lo >= (4294967296 - m) % m) return hi;
  }
}

export interface ConditionalDraws {
  /** Simulations with a local statistic at least as large as the observed one (ties within 1e-10 of its scale). */
  above: number;
  below: number;
  /** Mean and variance (divisor s − 1) of the simulated statistic: for checks against the analytical moments. */
  mean: number;
  variance: number;
}

/**
 * Draws for square i of the statistic c · (fixed + Σ_{j ∈ N(i), j ≠ i} w_ij v_π(j)), where `fixed` is the
 * square's own term (w_ii v_i for Gi*, else 0) and `observed` the statistic as observed. `pool` is scratch
 * space of length n.
 */
export function conditionalDraws(
  v: Float64Array,
  w: LatticeWeights,
  i: number,
  c: number,
  observed: number,
  permutations: number,
  seed: number,
  pool: Float64Array,
  maxAbs: number,
): ConditionalDraws {
  const n = v.length;
  pool.set(v);
  pool[i] = pool[n - 1];
  pool[n - 1] = v[i];
  const others = n - 1;
  let fixed = 0;
  let weightSum = 0;
  const ws: number[] = [];
  for (let p = w.start[i]; p < w.start[i + 1]; p++) {
    if (w.index[p] === i) fixed = w.weight[p] * v[i];
    else ws.push(w.weight[p]);
    weightSum += Math.abs(w.weight[p]);
  }
  const k = ws.length;
  const eps = 1e-10 * Math.abs(c) * weightSum * maxAbs + Number.MIN_VALUE;
  const u32 = createUint32Stream(seed, i);
  let above = 0;
  let below = 0;
  let sum = 0;
  let sumSq = 0;
  for (let s = 0; s < permutations; s++) {
    let lag = fixed;
    for (let t = 0; t < k; t++) {
      const r = t + uniformIndex(u32, others - t);
      const val = pool[r];
      pool[r] = pool[t];
      pool[t] = val;
      lag += ws[t] * val;
    }
    const stat = c * lag;
    if (stat >= observed - eps) above++;
    if (stat <= observed + eps) below++;
    sum += stat;
    sumSq += stat * stat;
  }
  const mean = permutations > 0 ? sum / permutations : NaN;
  const variance = permutations > 1 ? (sumSq - permutations * mean * mean) / (permutations - 1) : NaN;
  return { above, below, mean, variance };
}
