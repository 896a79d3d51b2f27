import { describe, expect, test } from "vitest";
import { pointwiseEnvelope, rankForLevel } from "./envelope";
import { globalTest, monteCarloPValue } from "./global-test";
import { createRandom } from "../random/random";
import { rankEnvelope } from "./rank-envelope";

// Five hand-made curves on three distances; column k of simulation i is sims[3i + k].
const sims = Float64Array.from([0, 1, 5, 0, 2, 4, 0, 3, 3, 0, 4, 2, 0, 5, 1]);
const set = { m: 3, s: 5, sims };

describe("pointwise envelopes", () => {
  test("rank 1 is the min and max, rank 2 the second from each end; level 2k/(s+1)", () => {
    const e1 = pointwiseEnvelope(set, 1);
    expect(Array.from(e1.lo)).toEqual([0, 1, 1]);
    expect(Array.from(e1.hi)).toEqual([0, 5, 5]);
    expect(e1.level).toBeCloseTo(2 / 6, 12);
    const e2 = pointwiseEnvelope(set, 2);
    expect(Array.from(e2.lo)).toEqual([0, 2, 2]);
    expect(Array.from(e2.hi)).toEqual([0, 4, 4]);
    expect(Array.from(e2.mean)).toEqual([0, 3, 3]);
  });

  test("the band by selection equals the k-th values of each fully sorted column, ties and all", () => {
    const rng = createRandom(31);
    for (const [s, m, rank] of [
      [999, 40, 25],
      [99, 7, 2],
      [19, 5, 1],
      [40, 3, 20],
    ]) {
      // values on a coarse grid so that many are tied
      const set = { m, s, sims: Float64Array.from({ length: s * m }, () => Math.round(rng.next() * 50) / 10) };
      const band = pointwiseEnvelope(set, rank);
      for (let k = 0; k < m; k++) {
        const col = Float64Array.from({ length: s }, (_, i) => set.sims[i * m + k]).sort();
        expect([band.lo[k], band.hi[k]]).toEqual([col[rank - 1], col[s - rank]]);
      }
    }
  });

  test("a simulated curve that is not a number is refused", () => {
    expect(() => pointwiseEnvelope({ m: 2, s: 3, sims: Float64Array.from([0, 1, 0, NaN, 0, 2]) })).toThrow(
      /not a number at grid value 2/,
    );
  });

  test("a rank beyond s/2 is refused; rankForLevel inverts 2k/(s+1)", () => {
    expect(() => pointwiseEnvelope(set, 3)).toThrow(/rank/);
    expect(rankForLevel(999, 0.05)).toBe(25); // 2·25/1000 = 0.05
    expect(rankForLevel(19, 0.05)).toBe(1);
  });
});

describe("global tests", () => {
  test("p = (1 + #{T_sim ≥ T_obs})/(s + 1) without ties", () => {
    // 2 of 9 simulated values exceed 5: p = 3/10 (Baddeley et al. 2014, eq. for the Monte Carlo p-value)
    expect(monteCarloPValue(5, [1, 2, 3, 4, 6, 7, 0.5, 4.9, 1.1], createRandom(1))).toBeCloseTo(0.3, 12);
    expect(monteCarloPValue(100, [1, 2, 3], createRandom(1))).toBeCloseTo(0.25, 12);
  });

  test("ties are broken at random: p spreads uniformly over the tied ranks", () => {
    const seen = new Map<number, number>();
    const rng = createRandom(2);
    for (let t = 0; t < 3000; t++) {
      const p = monteCarloPValue(5, [5, 5, 1], rng);
      seen.set(p, (seen.get(p) ?? 0) + 1);
    }
    // possible values 1/4, 2/4, 3/4 each with probability 1/3
    expect([...seen.keys()].sort()).toEqual([0.25, 0.5, 0.75]);
    for (const c of seen.values()) expect(Math.abs(c / 3000 - 1 / 3)).toBeLessThan(0.05);
  });

  test("MAD and DCLF against a theoretical curve, by hand", () => {
    const r = Float64Array.from([0, 1, 2]);
    const theory = Float64Array.from([0, 3, 3]);
    const obs = Float64Array.from([0, 6, 3]);
    const mad = globalTest(obs, set, r, { statistic: "mad", theory, rng: createRandom(1) });
    expect(mad.observed).toBe(3);
    expect(Array.from(mad.simulated)).toEqual([2, 1, 0, 1, 2]);
    expect(mad.pValue).toBeCloseTo(1 / 6, 12);
    const dclf = globalTest(obs, set, r, { statistic: "dclf", theory, rng: createRandom(1) });
    expect(dclf.observed).toBe(9); // (6−3)²·1 + 0
    expect(Array.from(dclf.simulated)).toEqual([8, 2, 0, 2, 8]);
    expect(dclf.pValue).toBeCloseTo(1 / 6, 12);
  });

  test("leave-one-out mean reference (random labelling)", () => {
    const r = Float64Array.from([0, 1, 2]);
    const obs = Float64Array.from([0, 3, 3]);
    const mad = globalTest(obs, set, r, { statistic: "mad", rng: createRandom(1) });
    // the mean of the 5 simulations is (0, 3, 3), so the observed curve deviates by 0
    expect(mad.observed).toBe(0);
    // simulation 1 (0, 1, 5) against the mean of the observed and sims 2..5: (0, 17/5, 13/5) → max dev 2.4
    expect(mad.simulated[0]).toBeCloseTo(2.4, 12);
    expect(mad.pValue).toBe(1);
  });

  test("extreme rank length: an observed curve above every simulation is the most extreme", () => {
    const obs = Float64Array.from([0, 9, 9]);
    const res = rankEnvelope(obs, set, 0.34);
    // Pointwise ranks (ties averaged): at r0 all six curves tie at 3.5; the observed has rank 1 at r1 and
    // r2, so its sorted vector is (1, 1, 3.5). Sims 1 and 5 have (1, 2, 3.5), the others larger: the
    // observed is alone most extreme and p = 1/6 (Myllymäki et al. 2017, the ERL ordering).
    expect(res.pValue).toBeCloseTo(1 / 6, 12);
    // ⌊0.34·6⌋ = 2 curves set aside: the observed and one of the two extreme simulations
    expect(res.hi[1]).toBeLessThanOrEqual(5);
    expect(res.lo[2]).toBeGreaterThanOrEqual(1);
  });
});
