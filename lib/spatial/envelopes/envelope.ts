/**
 * Pointwise simulation envelopes (Diggle 2003, Statistical Analysis of Spatial Point Patterns, §5.3): at
 * each r the band runs from the k-th lowest to the k-th highest of s simulated values. Under the null the
 * observed value lies outside the band at one fixed r with probability 2k/(s+1) (two-sided). This is a
 * picture, not a test: the band is crossed somewhere far more often than that (global-test.ts).
 */
import quickselect from "quickselect";
import { SpatialInputError } from "../errors";

/** s simulated curves on an m-point grid, row-major: value of simulation i at r_k is sims[i*m + k]. */
export interface CurveSet {
  m: number;
  s: number;
  sims: Float64Array;
}

export interface PointwiseEnvelope {
  lo: Float64Array;
  hi: Float64Array;
  /** Mean of the simulated curves. */
  mean: Float64Array;
  /** Rank used from each end. */
  rank: number;
  /** Two-sided pointwise significance level 2k/(s+1). */
  level: number;
}

export function assertCurveSet(set: CurveSet): void {
  if (!(set.s >= 1) || !(set.m >= 1) || set.sims.length < set.s * set.m) {
    throw new SpatialInputError(
      `A set of ${set.s} curves of ${set.m} values needs ${set.s * set.m} numbers; got ${set.sims.length}.`,
    );
  }
}

const byValue = (a: number, b: number): number => a - b;

/** Band from rank k of s at every r (k = 1: the simulated minimum and maximum). */
export function pointwiseEnvelope(set: CurveSet, rank = 1): PointwiseEnvelope {
  assertCurveSet(set);
  const { m, s, sims } = set;
  if (!Number.isInteger(rank) || rank < 1 || 2 * rank > s) {
    throw new SpatialInputError(
      `The envelope rank must be an integer from 1 to ${Math.floor(s / 2)} for ${s} simulations; got ${rank}.`,
    );
  }
  const lo = new Float64Array(m),
    hi = new Float64Array(m),
    mean = new Float64Array(m);
  const column = new Float64Array(s);
  // the k-th lowest and k-th highest by selection (Floyd & Rivest 1975, the quickselect package) rather
  // than a full sort of each column: the same two values, several times faster for 999 simulations
  const values = column as unknown as number[];
  for (let k = 0; k < m; k++) {
    let sum = 0;
    for (let i = 0; i < s; i++) {
      column[i] = sims[i * m + k];
      sum += column[i];
    }
    if (sum !== sum) throw new SpatialInputError(`A simulated curve is not a number at grid value ${k + 1}.`);
    quickselect(values, rank - 1, 0, s - 1, byValue);
    lo[k] = column[rank - 1];
    quickselect(values, s - rank, rank, s - 1, byValue);
    hi[k] = column[s - rank];
    mean[k] = sum / s;
  }
  return { lo, hi, mean, rank, level: (2 * rank) / (s + 1) };
}

/** Rank k giving the nearest two-sided pointwise level to `level` that is not above it (at least 1). */
export function rankForLevel(s: number, level: number): number {
  return Math.max(1, Math.floor((level * (s + 1)) / 2));
}
