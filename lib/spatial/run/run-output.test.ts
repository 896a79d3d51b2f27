/**
 * What a curve test reports beyond its verdict: the raw K beside L, the global statistic's observed value
 * with a summary of the simulated values (consistent with the p-value), and which function was tested.
 */
import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { createWindow } from "../geometry/window";
import { kFunction } from "../estimators/k-function";
import { createRandom } from "../random/random";
import { createWindowSampler } from "../random/sample-window";
import { runDistributionTest } from "./run-test";

const win = createWindow(DEMO_TRENCH);
function uniform(seed: number, n: number) {
  const x = new Float64Array(n),
    y = new Float64Array(n);
  createWindowSampler(win).fill(createRandom(seed), n, x, y);
  return Array.from(x, (v, k) => ({ x: v, y: y[k] }));
}

describe("curve test output", () => {
  const points = uniform(12, 40);
  const spec = { window: DEMO_TRENCH, points, nsim: 59, seed: 4, workers: 0, r: { count: 65 } };

  for (const statistic of ["mad", "dclf"] as const) {
    test(`${statistic}: the observed statistic is recomputed from the curves, and the p-value from the simulated values`, async () => {
      const res = (await runDistributionTest({ ...spec, tests: [{ type: "l-envelope", statistic, count: "fixed" }] }))
        .results[0];
      const c = res.curves!;
      const g = c.global;
      if (g.statistic === "rank") throw new Error("not a rank test");
      let t = 0;
      for (let k = 0; k < c.r.length; k++) {
        const e = c.observed[k]! - c.reference[k]!;
        t = statistic === "mad" ? Math.max(t, Math.abs(e)) : t + (k > 0 ? e * e * (c.r[k] - c.r[k - 1]) : 0);
      }
      expect(Math.abs(g.observed - t)).toBeLessThanOrEqual(1e-7 * t);
      // p = (1 + #{T_sim > T_obs} + U) / (s + 1), U uniform over the ties (statistics.md: ties broken at random);
      // the MAD of fixed-n patterns ties often (at the first r, where few patterns have a pair), DCLF not here
      expect(res.pValue).toBeGreaterThanOrEqual((1 + g.largerThanObserved) / 60);
      expect(res.pValue).toBeLessThanOrEqual((1 + g.atLeastObserved) / 60);
      if (statistic === "dclf") expect(g.atLeastObserved).toBe(g.largerThanObserved);
      const s = g.simulated;
      expect(s.min).toBeLessThanOrEqual(s.q1);
      expect(s.q1).toBeLessThanOrEqual(s.median);
      expect(s.median).toBeLessThanOrEqual(s.q3);
      expect(s.q3).toBeLessThanOrEqual(s.max);
      expect(s.mean).toBeGreaterThan(s.min);
      expect(s.mean).toBeLessThan(s.max);
      expect(c.fun).toBe("L");
    });
  }

  test("raw K beside L: the K of the same finds on the same grid", async () => {
    const res = (
      await runDistributionTest({
        ...spec,
        tests: [{ type: "l-envelope" }, { type: "l-envelope", correction: "translation" }],
      })
    ).results;
    for (const [i, correction] of [
      [0, "isotropic"],
      [1, "translation"],
    ] as const) {
      const c = res[i].curves!;
      const K = kFunction(win, { x: points.map((p) => p.x), y: points.map((p) => p.y) }, { r: c.r, correction }).K[
        correction
      ]!;
      // results carry 10 significant digits, and the simulation kernel sums its weights in its own order
      c.observedK!.forEach((v, k) => expect(Math.abs(v! - K[k])).toBeLessThanOrEqual(1e-8 * K[k] + 1e-12));
      for (let k = 0; k < c.r.length; k++)
        expect(Math.abs(c.observed[k]! - Math.sqrt(c.observedK![k]! / Math.PI))).toBeLessThanOrEqual(1e-9);
    }
  });

  test("the rank test reports its p-value interval instead of a statistic", async () => {
    const res = (await runDistributionTest({ ...spec, tests: [{ type: "l-envelope", statistic: "rank" }] })).results[0];
    const g = res.curves!.global;
    expect(g.statistic).toBe("rank");
    if (g.statistic === "rank") {
      expect(g.pInterval[0]).toBeLessThanOrEqual(g.pInterval[1]);
      expect(res.pValue).toBe(g.pInterval[1]);
    }
  });
});
