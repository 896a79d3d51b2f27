/**
 * The global rank envelope test with the extreme rank length (ERL) measure (Myllymäki, Mrkvička, Grabarnik,
 * Seijo & Hahn 2017, JRSS B 79:381–404). Among the s + 1 curves (observed first, then the simulations),
 * each curve gets at every r its two-sided pointwise rank min(rank from below, rank from above), ties given
 * their average rank. A curve's ERL vector is its pointwise ranks sorted ascending; one curve is more
 * extreme than another when its vector is lexicographically smaller. The p-value is the share of the s + 1
 * curves at least as extreme as the observed one, and the 100(1 − α) % global envelope is the pointwise range
 * of the simulated curves left after the ⌊α(s+1)⌋ most extreme of all s + 1 curves are set aside: the
 * observed curve leaves it somewhere exactly when the test rejects at level α.
 */
import { assertCurveSet, type CurveSet } from "./envelope";
import { SpatialInputError } from "../errors";

export interface RankEnvelopeResult {
  pValue: number;
  /** [p_interval_low, p_interval_high]: the p-value with ties of ERL vectors counted against / for the observed. */
  pInterval: [number, number];
  lo: Float64Array;
  hi: Float64Array;
  level: number;
}

export function rankEnvelope(
  observed: Float64Array,
  set: CurveSet,
  level: number,
  range: [number, number] = [0, set.m],
): RankEnvelopeResult {
  assertCurveSet(set);
  const { m, s, sims } = set;
  if (!(level > 0 && level < 1))
    throw new SpatialInputError(`The level must lie strictly between 0 and 1; got ${level}.`);
  if (observed.length !== m)
    throw new SpatialInputError(`The observed curve has ${observed.length} values for ${m} distances.`);
  const [from, to] = range;
  const width = to - from;
  if (!(from >= 0 && to <= m && width > 0))
    throw new SpatialInputError(`Bad range of distances for the rank envelope: [${from}, ${to}).`);
  const total = s + 1;
  const value = (c: number, k: number): number => (c === 0 ? observed[k] : sims[(c - 1) * m + k]);
  const ranks = new Float64Array(total * width); // curve c's pointwise ranks at row c
  const idx = new Int32Array(total);
  const col = new Float64Array(total);
  for (let k = from; k < to; k++) {
    for (let c = 0; c < total; c++) {
      idx[c] = c;
      col[c] = value(c, k);
    }
    idx.sort((a, b) => col[a] - col[b]);
    for (let a = 0; a < total;) {
      let b = a;
      while (b + 1 < total && col[idx[b + 1]] === col[idx[a]]) b++;
      const low = (a + b) / 2 + 1; // average rank from below, 1-based
      const pointwise = Math.min(low, total + 1 - low);
      for (let t = a; t <= b; t++) ranks[idx[t] * width + (k - from)] = pointwise;
      a = b + 1;
    }
  }
  for (let c = 0; c < total; c++) ranks.subarray(c * width, (c + 1) * width).sort();
  const compare = (a: number, b: number): number => {
    for (let t = 0; t < width; t++) {
      const d = ranks[a * width + t] - ranks[b * width + t];
      if (d !== 0) return d;
    }
    return 0;
  };
  let moreExtreme = 0,
    tied = 0;
  for (let c = 1; c < total; c++) {
    const d = compare(c, 0);
    if (d < 0) moreExtreme++;
    else if (d === 0) tied++;
  }
  const pLow = (1 + moreExtreme) / total;
  const pHigh = (1 + moreExtreme + tied) / total;
  const order = Array.from({ length: total }, (_, c) => c).sort(compare);
  const drop = Math.floor(level * total);
  const lo = new Float64Array(m).fill(Infinity),
    hi = new Float64Array(m).fill(-Infinity);
  for (let t = drop; t < total; t++) {
    const c = order[t];
    if (c === 0) continue;
    for (let k = 0; k < m; k++) {
      const v = value(c, k);
      if (v < lo[k]) lo[k] = v;
      if (v > hi[k]) hi[k] = v;
    }
  }
  // ERL ties between the observed and a simulation are rare; the conservative end is reported.
  return { pValue: pHigh, pInterval: [pLow, pHigh], lo, hi, level };
}
