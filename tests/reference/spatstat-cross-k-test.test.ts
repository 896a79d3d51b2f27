/**
 * The between-class envelope test on K (spatstat's envelope of Kcross tests on K) as well as on L: the
 * observed curve of a run with fun "K" is spatstat's Kcross(i = A, j = B) on the fixture's grid, the one with
 * fun "L" its Lcross, and the result names the function it tested on. Fixtures from make-fixtures.R.
 */
import { describe, expect, it } from "vitest";
import { runDistributionTest } from "@/lib/spatial";
import { expectCurve, fixtureFiles, loadFixture, source } from "./fixture";

const files = fixtureFiles("trench-l-").filter((f) => loadFixture(f).cross);

describe("cross-K and cross-L envelope tests", () => {
  it("has two-class fixtures to check", () => expect(files.length).toBeGreaterThanOrEqual(2));
  for (const file of files) {
    it(`${file}: the run's observed curve is spatstat's Kcross / Lcross, and the result says which`, async () => {
      const fx = loadFixture(file);
      const cross = (fx as unknown as { cross: { KcrossAB: number[]; LcrossAB: number[]; callKcrossAB: string } })
        .cross;
      const points = fx.points.x.map((x, k) => ({ x, y: fx.points.y[k], cls: fx.points.marks![k] }));
      const base = {
        window: { outer: fx.window.outer, holes: fx.window.holes },
        points,
        r: fx.r,
        nsim: 19,
        seed: 3,
        workers: 0,
      };
      for (const nul of ["random-labelling", "a-fixed"] as const) {
        const res = await runDistributionTest({
          ...base,
          tests: [
            { type: "cross-l", a: "A", b: "B", null: nul, fun: "K" },
            { type: "cross-l", a: "A", b: "B", null: nul },
          ],
        });
        const [k, l] = res.results;
        const label = source(fx, cross.callKcrossAB);
        expectCurve(
          k.curves!.observed.map((v) => v ?? NaN),
          cross.KcrossAB,
          `${label}, ${nul}, fun K`,
        );
        expectCurve(
          l.curves!.observed.map((v) => v ?? NaN),
          cross.LcrossAB,
          `${label}, ${nul}, fun L`,
        );
        expect(k.curves!.fun).toBe("K");
        expect(l.curves!.fun).toBe("L");
        expect(k.test).toMatch(/^cross-K \(A→B\)/);
        expect(l.test).toMatch(/^cross-L \(A→B\)/);
        expect(k.options).toMatchObject({ fun: "K" });
        // raw K beside L, on the L test
        expectCurve(
          l.curves!.observedK!.map((v) => v ?? NaN),
          cross.KcrossAB,
          `${label}, ${nul}, K beside L`,
        );
        // B under CSR: K(r) = πr² (results carry 10 significant digits)
        if (nul === "a-fixed")
          k.curves!.reference.forEach((v, i) =>
            expect(Math.abs(v! - Math.PI * fx.r[i] ** 2)).toBeLessThanOrEqual(1e-9 * Math.PI * fx.r[i] ** 2),
          );
      }
    });
  }
});
