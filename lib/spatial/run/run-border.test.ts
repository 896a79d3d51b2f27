/**
 * The border correction where it is undefined (spatstat's NA beyond the deepest point; checked against
 * spatstat in tests/reference/spatstat-border.test.ts): the run gives L where it is defined, null beyond,
 * and runs the global test over the distances where the observed and every simulated curve are defined,
 * saying which; a pattern too shallow for any test is refused, naming whose curve stops short.
 */
import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { createWindow } from "../geometry/window";
import { createRandom } from "../random/random";
import { createWindowSampler } from "../random/sample-window";
import { runDistributionTest } from "./run-test";

const win = createWindow(DEMO_TRENCH);
const sampler = createWindowSampler(win);
function uniform(seed: number, n: number) {
  const rng = createRandom(seed);
  const out = { x: new Float64Array(n), y: new Float64Array(n) };
  sampler.fill(rng, n, out.x, out.y);
  return Array.from(out.x, (x, k) => ({ x, y: out.y[k] }));
}
const grid = (rmax: number, count: number) => Array.from({ length: count }, (_, k) => (rmax * k) / (count - 1));

describe("border-corrected L beyond the deepest point", () => {
  for (const statistic of ["mad", "dclf", "rank"] as const) {
    test(`${statistic}: the test runs where every curve is defined, and equals the same test on that range alone`, async () => {
      const points = uniform(4, 25);
      const r = grid(3, 61);
      const spec = {
        window: DEMO_TRENCH,
        points,
        nsim: 39,
        seed: 8,
        workers: 0,
        tests: [{ type: "l-envelope" as const, correction: "border" as const, statistic }],
      };
      const whole = (await runDistributionTest({ ...spec, r })).results[0];
      const c = whole.curves!;
      expect(c.range.wholeGrid).toBe(false);
      expect(c.range.values).toBeGreaterThan(3);
      expect(c.range.values).toBeLessThan(r.length);
      expect(c.range.to).toBe(r[c.range.values - 1]);
      // the observed L is given up to the deepest find, null beyond; the band stops where the range stops
      const deepest = Math.max(...points.map((p) => win.boundaryDistance(p.x, p.y)));
      c.observed.forEach((v, k) => expect(v === null, `observed at r = ${r[k]}`).toBe(k > 0 && r[k - 1] > deepest));
      c.band.lo.forEach((v, k) => expect(v === null).toBe(k >= c.range.values));
      expect(whole.cautions.join(" ")).toMatch(
        new RegExp(`test used r from 0 to ${String(Number(c.range.to.toPrecision(4))).replace(".", "\\.")} m only`),
      );
      for (const e of c.excursions) expect(e.to).toBeLessThanOrEqual(c.range.to);
      // the same run on the grid cut at the end of the range: the same simulations, the same p-value
      const cut = (await runDistributionTest({ ...spec, r: r.slice(0, c.range.values) })).results[0];
      expect(cut.curves!.range.wholeGrid).toBe(true);
      expect(cut.pValue).toBe(whole.pValue);
      expect(cut.curves!.observed).toEqual(c.observed.slice(0, c.range.values));
      expect(cut.curves!.band).toEqual({
        ...c.band,
        lo: c.band.lo.slice(0, c.range.values),
        hi: c.band.hi.slice(0, c.range.values),
      });
    });
  }

  test("observed finds too shallow: refused, and the message speaks of the observed finds", async () => {
    const points = Array.from({ length: 12 }, (_, k) => ({ x: 1 + k * 0.8, y: 0.025 * (1 + k * 0.8) + 0.03 }));
    const run = runDistributionTest({
      window: DEMO_TRENCH,
      points,
      nsim: 19,
      workers: 0,
      r: [0, 0.5, 1, 1.5],
      tests: [{ type: "l-envelope", correction: "border" }],
    });
    await expect(run).rejects.toThrow(/curve of the observed finds is defined only up to r = 0\.5 m/);
    await expect(run).rejects.not.toThrow(/simulated/);
  });

  test("simulated patterns too shallow: refused, naming the simulation", async () => {
    const points = [
      { x: 2.5, y: 3.9 },
      { x: 0.3, y: 0.3 },
      { x: 4.8, y: 7.5 },
    ];
    const run = runDistributionTest({
      window: DEMO_TRENCH,
      points,
      nsim: 19,
      seed: 2,
      workers: 0,
      r: [0, 1.5, 1.6, 1.7],
      tests: [{ type: "l-envelope", correction: "border" }],
    });
    await expect(run).rejects.toThrow(/curve of simulated pattern \d+ is defined only up to r = 1\.5 m/);
  });
});
