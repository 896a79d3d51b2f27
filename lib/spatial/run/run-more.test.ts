import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { createRandom } from "../random/random";
import { monteCarloRankPValue } from "./run-classic-tests";
import { runDistributionTest } from "./run-test";
import { createWindowSampler } from "../random/sample-window";
import { createWindow } from "../geometry/window";

const win = createWindow(DEMO_TRENCH);
const sampler = createWindowSampler(win);

/** Inhomogeneous Poisson with intensity rising eastwards (∝ x), by thinning uniform draws. */
function eastward(seed: number, n: number, cls: string) {
  const rng = createRandom(seed);
  const out: { x: number; y: number; cls: string }[] = [];
  const x = new Float64Array(1),
    y = new Float64Array(1);
  while (out.length < n) {
    sampler.fill(rng, 1, x, y);
    if (rng.next() < x[0] / 12.1) out.push({ x: x[0], y: y[0], cls });
  }
  return out;
}

/** Tight clusters around parents drawn from the same eastward trend. */
function eastwardClusters(seed: number, parents: number, size: number, cls: string) {
  const rng = createRandom(seed + 1);
  return eastward(seed, parents, cls).flatMap((p) =>
    Array.from({ length: size }, () => ({
      x: p.x + (rng.next() - 0.5) * 0.4,
      y: p.y + (rng.next() - 0.5) * 0.4,
      cls,
    })).filter((q) => win.contains(q.x, q.y)),
  );
}

const base = { window: DEMO_TRENCH, nsim: 99, workers: 0, seed: 11 };

describe("kernel-based tests", () => {
  test("a trend alone: L under CSR says clustered, the inhomogeneous L finds no clustering beyond the trend", async () => {
    const points = [...eastward(1, 200, "B"), ...eastwardClusters(2, 6, 8, "A")];
    const res = await runDistributionTest({
      ...base,
      points,
      tests: [
        { type: "l-envelope", class: "B" },
        { type: "inhomogeneous-l", class: "B" },
        { type: "inhomogeneous-l", class: "A", reference: "B" },
      ],
    });
    expect(res.results.map((r) => r.verdict)).toEqual(["clustered", "no evidence against the null", "clustered"]);
    expect(res.results[1].cautions.join(" ")).toMatch(/bandwidth/);
  });

  test("pair correlation: clustered finds lie above g = 1 at short distances", async () => {
    const res = await runDistributionTest({
      ...base,
      points: eastwardClusters(3, 8, 10, "A"),
      tests: [{ type: "pcf-envelope" }],
    });
    const r = res.results[0];
    expect(r.verdict).toBe("clustered");
    expect(r.curves!.reference.every((v) => v === 1)).toBe(true);
    expect(r.curves!.r[0]).toBeGreaterThan(0);
    expect(r.curves!.excursions[0].side).toBe("above");
  });
});

describe("Clark–Evans and quadrat tests in a run", () => {
  test("clustered finds: every Clark–Evans version and the quadrat test say clustered, with R < 1", async () => {
    const points = eastwardClusters(4, 6, 12, "A");
    const res = await runDistributionTest({
      ...base,
      points,
      tests: [
        { type: "clark-evans" },
        { type: "clark-evans", correction: "donnelly" },
        { type: "clark-evans", correction: "monte-carlo", alternative: "clustered" },
        { type: "quadrat", nx: 4, ny: 3 },
      ],
    });
    for (const r of res.results) expect(r.verdict).toBe("clustered");
    expect(res.results[0].details.R as number).toBeLessThan(1);
    expect(res.results[3].details.pMonteCarlo as number).toBeLessThanOrEqual(0.05);
  });

  test("Monte Carlo rank p-value by hand", () => {
    const sims = [1, 2, 3, 4, 5, 6, 7, 8, 9];
    // observed 2: 2 sims ≤ 2 → (1 + 2)/10; 8 sims ≥ 2 → (1 + 8)/10
    expect(monteCarloRankPValue(2, sims, "clustered", true)).toBeCloseTo(0.3, 12);
    expect(monteCarloRankPValue(2, sims, "regular", true)).toBeCloseTo(0.9, 12);
    expect(monteCarloRankPValue(2, sims, "two-sided", true)).toBeCloseTo(0.6, 12);
    // for X², large means clustered
    expect(monteCarloRankPValue(9.5, sims, "clustered", false)).toBeCloseTo(0.1, 12);
  });
});
