import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { createRandom } from "./random";
import { createWindowSampler } from "./sample-window";
import { createWindow } from "../geometry/window";

describe("uniform points in a trench window", () => {
  test("property: every sample lies inside the window (L-shapes with a hole)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 30, noNaN: true }),
        fc.double({ min: 2, max: 30, noNaN: true }),
        fc.double({ min: 0.2, max: 0.8, noNaN: true }),
        fc.double({ min: 0.2, max: 0.8, noNaN: true }),
        fc.integer({ min: 0, max: 1e6 }),
        (w, h, fx, fy, seed) => {
          // an L: the top-right corner (fx·w .. w) × (fy·h .. h) cut away, a small hole in the bottom arm
          const cx = fx * w,
            cy = fy * h;
          const hole: [number, number][] = [
            [cx * 0.3, cy * 0.3],
            [cx * 0.6, cy * 0.3],
            [cx * 0.6, cy * 0.6],
            [cx * 0.3, cy * 0.6],
          ];
          const win = createWindow({
            outer: [
              [0, 0],
              [w, 0],
              [w, cy],
              [cx, cy],
              [cx, h],
              [0, h],
            ],
            holes: [hole],
          });
          const sampler = createWindowSampler(win, 256);
          const n = 200,
            x = new Float64Array(n),
            y = new Float64Array(n);
          sampler.fill(createRandom(seed), n, x, y);
          for (let k = 0; k < n; k++) if (!win.contains(x[k], y[k])) return false;
          return true;
        },
      ),
      { numRuns: 60 },
    );
  });

  test("the share of points in the baulk-side strip matches its share of the area", () => {
    const win = createWindow(DEMO_TRENCH);
    const sampler = createWindowSampler(win);
    const n = 50_000,
      x = new Float64Array(n),
      y = new Float64Array(n);
    sampler.fill(createRandom(9), n, x, y);
    // The strip x > 6 lies wholly in the long arm: y from the bottom edge to the top edge, minus the baulk.
    const strip = createWindow({
      outer: [
        [6, 0.1487603305785124],
        [12.1, 0.3],
        [11.8, 3.9],
        [6, 4.251515151515152],
      ],
      holes: DEMO_TRENCH.holes,
    });
    const p = strip.area / win.area;
    const hits = Array.from(x).filter((v) => v > 6).length;
    // binomial sd √(p(1−p)/n) ≈ 0.0022; 5 sd
    expect(Math.abs(hits / n - p)).toBeLessThan(5 * Math.sqrt((p * (1 - p)) / n));
    expect(sampler.efficiency).toBeGreaterThan(0.8);
  });

  test("buffers too small are refused", () => {
    const sampler = createWindowSampler(createWindow(DEMO_TRENCH));
    expect(() => sampler.fill(createRandom(1), 5, new Float64Array(2), new Float64Array(2))).toThrow(/fewer than 5/);
  });
});
