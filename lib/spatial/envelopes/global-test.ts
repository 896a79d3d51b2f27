/**
 * Global Monte Carlo tests on a summary function (Baddeley, Diggle, Hardegen, Lawrence, Milne & Nair 2014,
 * Ecol. Monogr. 84:477–489): the deviation of each curve from a reference is reduced to one number, the
 * maximum absolute deviation (MAD) or the integrated squared deviation (DCLF: Diggle 1986; Cressie 1991;
 * Loosmore & Ford 2006, Ecology 87:1925–1931), and the observed number is ranked among the simulated ones:
 * p = (1 + #{T_sim > T_obs} + U) / (s + 1), U uniform on 0..#{T_sim = T_obs}, i.e. ties broken at random
 * (with no ties this is (1 + #{T_sim ≥ T_obs}) / (s + 1)).
 *
 * The reference is the theoretical curve under CSR. Otherwise (random labelling) it is the mean of the
 * other curves, as spatstat's `envelopeTest(leaveout = 1)` does: the observed curve against the mean of
 * the s simulations, each simulated curve against the mean of the s others (observed included), which
 * keeps the s + 1 deviations exchangeable under the null.
 */
import { assertCurveSet, type CurveSet } from "./envelope";
import { SpatialInputError } from "../errors";
import type { Random } from "../random/random";

export type GlobalStatistic = "mad" | "dclf";

export interface GlobalTestResult {
  statistic: GlobalStatistic;
  observed: number;
  /** Deviation of each simulation, in simulation order. */
  simulated: Float64Array;
  pValue: number;
  /** Number of simulations s. */
  nsim: number;
}

/** The p-value rule above, with `rng` breaking ties. */
export function monteCarloPValue(observed: number, simulated: ArrayLike<number>, rng: Random): number {
  if (!Number.isFinite(observed)) throw new SpatialInputError(`The observed statistic is ${observed}; cannot rank it.`);
  let above = 0,
    ties = 0;
  for (let i = 0; i < simulated.length; i++) {
    if (!Number.isFinite(simulated[i])) throw new SpatialInputError(`Simulated statistic ${i + 1} is ${simulated[i]}.`);
    if (simulated[i] > observed) above++;
    else if (simulated[i] === observed) ties++;
  }
  const broken = ties > 0 ? rng.int(ties + 1) : 0;
  return (1 + above + broken) / (simulated.length + 1);
}

/**
 * Deviation of a curve from a reference over grid indices [from, to): max |f − ref| (MAD), or the
 * Riemann sum Σ (f − ref)² Δr_k (DCLF, Δr_k = r_k − r_{k−1}).
 */
function deviation(
  statistic: GlobalStatistic,
  f: ArrayLike<number>,
  offset: number,
  ref: ArrayLike<number>,
  r: Float64Array,
  from: number,
  to: number,
): number {
  let t = 0;
  for (let k = from; k < to; k++) {
    const e = f[offset + k] - ref[k];
    if (statistic === "mad") t = Math.max(t, Math.abs(e));
    else t += e * e * (k > 0 ? r[k] - r[k - 1] : 0);
  }
  return t;
}

export interface GlobalTestOptions {
  statistic: GlobalStatistic;
  /** Theoretical curve under the null; without it the leave-one-out mean is the reference. */
  theory?: Float64Array;
  /** Grid indices used, default all: [from, to). */
  from?: number;
  to?: number;
  rng: Random;
}

export function globalTest(
  observed: Float64Array,
  set: CurveSet,
  r: Float64Array,
  options: GlobalTestOptions,
): GlobalTestResult {
  assertCurveSet(set);
  const { m, s, sims } = set;
  const { statistic, theory, rng } = options;
  if (statistic !== "mad" && statistic !== "dclf")
    throw new SpatialInputError(`Unknown global statistic "${String(statistic)}"; use mad or dclf.`);
  if (observed.length !== m || r.length !== m)
    throw new SpatialInputError(`The observed curve has ${observed.length} values for ${m} distances.`);
  const from = options.from ?? 0,
    to = options.to ?? m;
  if (!(from >= 0 && to <= m && to > from))
    throw new SpatialInputError(`Bad range of distances for the global test: [${from}, ${to}).`);
  const simulated = new Float64Array(s);
  let obs: number;
  if (theory) {
    obs = deviation(statistic, observed, 0, theory, r, from, to);
    for (let i = 0; i < s; i++) simulated[i] = deviation(statistic, sims, i * m, theory, r, from, to);
  } else {
    if (s < 2) throw new SpatialInputError("A test against the mean of the simulations needs at least 2 simulations.");
    const total = Float64Array.from(observed);
    for (let i = 0; i < s; i++) for (let k = 0; k < m; k++) total[k] += sims[i * m + k];
    const ref = new Float64Array(m);
    for (let k = 0; k < m; k++) ref[k] = (total[k] - observed[k]) / s;
    obs = deviation(statistic, observed, 0, ref, r, from, to);
    for (let i = 0; i < s; i++) {
      for (let k = 0; k < m; k++) ref[k] = (total[k] - sims[i * m + k]) / s;
      simulated[i] = deviation(statistic, sims, i * m, ref, r, from, to);
    }
  }
  return { statistic, observed: obs, simulated, pValue: monteCarloPValue(obs, simulated, rng), nsim: s };
}
