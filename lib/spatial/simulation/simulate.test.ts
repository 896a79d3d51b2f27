import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { createRandom } from "../random/random";
import { excursions } from "../run/run-envelope";
import { createWindowSampler } from "../random/sample-window";
import { csrCount, shuffleLabels, simulateInhomogeneous } from "./simulate";
import { createWindow } from "../geometry/window";

const win = createWindow(DEMO_TRENCH);

describe("null models", () => {
  test("random labelling: each of the 6 orders of 3 labels comes up about 1/6 of the time", () => {
    const rng = createRandom(8);
    const seen = new Map<string, number>();
    const trials = 12_000;
    for (let t = 0; t < trials; t++) {
      const l = Int32Array.from([0, 1, 2]);
      shuffleLabels(l, rng);
      seen.set(l.join(""), (seen.get(l.join("")) ?? 0) + 1);
    }
    expect(seen.size).toBe(6);
    // binomial sd √(p(1−p)/trials) ≈ 0.0034 for p = 1/6; 5 sd
    for (const c of seen.values()) expect(Math.abs(c / trials - 1 / 6)).toBeLessThan(0.017);
  });

  test("Poisson count: mean n; fixed count: n itself", () => {
    const rng = createRandom(4);
    let s = 0;
    for (let t = 0; t < 4000; t++) s += csrCount("poisson", 50, rng);
    expect(Math.abs(s / 4000 - 50)).toBeLessThan(5 * Math.sqrt(50 / 4000));
    expect(csrCount("fixed", 50, rng)).toBe(50);
  });

  test("thinning: the mean count is ∫λ over W and points follow λ", () => {
    // λ(x, y) = 2·x/12.1 finds per m²: left half of the window gets far fewer points than the right
    const sampler = createWindowSampler(win);
    const rng = createRandom(6);
    const buffers = { x: new Float64Array(0), y: new Float64Array(0) };
    let total = 0,
      west = 0;
    const runs = 300;
    for (let t = 0; t < runs; t++) {
      const n = simulateInhomogeneous(sampler, (x) => (2 * x) / 12.1, 2, rng, buffers);
      total += n;
      for (let k = 0; k < n; k++) if (buffers.x[k] < 3) west++;
    }
    // ∫λ by a fine midpoint sum over W (outside reference: plain quadrature)
    let integral = 0,
      westIntegral = 0;
    const h = 0.02;
    for (let x = h / 2; x < 12.1; x += h) {
      for (let y = h / 2; y < 8; y += h) {
        if (!win.contains(x, y)) continue;
        integral += ((2 * x) / 12.1) * h * h;
        if (x < 3) westIntegral += ((2 * x) / 12.1) * h * h;
      }
    }
    const mean = total / runs;
    expect(Math.abs(mean - integral)).toBeLessThan(5 * Math.sqrt(integral / runs));
    // share of points west of x = 3 against its share of ∫λ (binomial sd over ~total points, 5 sd)
    const share = westIntegral / integral;
    expect(Math.abs(west / total - share)).toBeLessThan(5 * Math.sqrt((share * (1 - share)) / total));
    expect(() => simulateInhomogeneous(sampler, () => 5, 2, rng, buffers)).toThrow(/outside \[0, λ_max\]/);
  });
});

describe("excursions from the band", () => {
  test("ranges above and below, and where the curve rejoins", () => {
    const r = Float64Array.from([0, 1, 2, 3, 4, 5]);
    const lo = Float64Array.from([0, 0, 0, 0, 0, 0]);
    const hi = Float64Array.from([1, 1, 1, 1, 1, 1]);
    const obs = Float64Array.from([0, 2, 2, 0.5, -1, -1]);
    expect(excursions(r, obs, lo, hi)).toEqual([
      { side: "above", from: 1, to: 3, rejoins: true },
      { side: "below", from: 4, to: 5, rejoins: false },
    ]);
  });
});
