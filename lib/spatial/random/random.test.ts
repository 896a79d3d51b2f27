import { describe, expect, test } from "vitest";
import jStat from "./jstat-typed";
import { poissonCount } from "./poisson-count";
import { createRandom } from "./random";

describe("seeded streams", () => {
  test("same seed and stream give the same numbers, other streams differ", () => {
    const a = createRandom(42, 7),
      b = createRandom(42, 7),
      c = createRandom(42, 8),
      d = createRandom(43, 7);
    const xs = Array.from({ length: 5 }, () => a.next());
    expect(Array.from({ length: 5 }, () => b.next())).toEqual(xs);
    expect(Array.from({ length: 5 }, () => c.next())).not.toEqual(xs);
    expect(Array.from({ length: 5 }, () => d.next())).not.toEqual(xs);
  });

  test("uniform doubles: in [0, 1), mean and decile counts as expected", () => {
    const rng = createRandom(1);
    const n = 100_000;
    const deciles = new Array(10).fill(0);
    let sum = 0;
    for (let k = 0; k < n; k++) {
      const u = rng.next();
      expect(u >= 0 && u < 1).toBe(true);
      sum += u;
      deciles[Math.floor(u * 10)]++;
    }
    // mean of U(0,1) has sd 1/√(12n) ≈ 0.0009; 5 sd
    expect(Math.abs(sum / n - 0.5)).toBeLessThan(0.0046);
    // Pearson X² on 10 equal cells, df 9: the 0.999 quantile of χ²₉ is 27.88 (standard tables)
    const x2 = deciles.reduce((s, o) => s + (o - n / 10) ** 2 / (n / 10), 0);
    expect(x2).toBeLessThan(27.88);
  });

  test("int(n) stays in range and hits every value", () => {
    const rng = createRandom(5);
    const seen = new Set<number>();
    for (let k = 0; k < 2000; k++) {
      const v = rng.int(7);
      expect(Number.isInteger(v) && v >= 0 && v < 7).toBe(true);
      seen.add(v);
    }
    expect(seen.size).toBe(7);
  });

  test("bad seeds are refused", () => {
    expect(() => createRandom(-1)).toThrow(/seed/);
    expect(() => createRandom(1.5)).toThrow(/seed/);
    expect(() => createRandom(Number.NaN)).toThrow(/seed/);
  });
});

describe("Poisson counts", () => {
  test.each([3, 60])("mean %d: sample mean and variance both near the mean", (mean) => {
    const rng = createRandom(11);
    const n = 20_000;
    let s = 0,
      s2 = 0;
    for (let k = 0; k < n; k++) {
      const v = poissonCount(rng, mean);
      s += v;
      s2 += v * v;
    }
    const m = s / n,
      v = s2 / n - m * m;
    // sd of the sample mean is √(mean/n); 5 sd. Variance: sd ≈ mean·√(2/n) for large mean, 6 sd allowed.
    expect(Math.abs(m - mean)).toBeLessThan(5 * Math.sqrt(mean / n));
    expect(Math.abs(v - mean)).toBeLessThan(6 * mean * Math.sqrt(2 / n) + 0.1);
  });

  test("P(N = 0) for mean 2 matches e^-2 (Poisson pmf)", () => {
    const rng = createRandom(3);
    let zeros = 0;
    const n = 40_000;
    for (let k = 0; k < n; k++) if (poissonCount(rng, 2) === 0) zeros++;
    const p = Math.exp(-2);
    expect(Math.abs(zeros / n - p)).toBeLessThan(5 * Math.sqrt((p * (1 - p)) / n));
    expect(jStat.gammaln(5)).toBeCloseTo(Math.log(24), 10);
  });

  test("a negative or infinite mean is refused", () => {
    expect(() => poissonCount(createRandom(1), -1)).toThrow(/Poisson mean/);
    expect(() => poissonCount(createRandom(1), Infinity)).toThrow(/Poisson mean/);
  });
});
