import { describe, expect, it } from "vitest";
import jStat from "../random/jstat-typed";
import { createWindow, rectangleWindow } from "../geometry/window";
import { gaussianEdgeMass } from "../geometry/kernel-mass";
import { densityGrid, intensityAtPoints, scottBandwidth } from "./intensity";

const Phi = (z: number) => jStat.normal.cdf(z, 0, 1);
/** Mass of N(u, σ²I) in the rectangle [x0,x1]×[y0,y1]: a product of normal probabilities. */
const boxMass = (ux: number, uy: number, s: number, x0: number, x1: number, y0: number, y1: number) =>
  (Phi((x1 - ux) / s) - Phi((x0 - ux) / s)) * (Phi((y1 - uy) / s) - Phi((y0 - uy) / s));

describe("Gaussian edge mass e(u)", () => {
  it("in a rectangle equals the product of normal probabilities", () => {
    const w = rectangleWindow(0, 0, 4, 3);
    for (const [x, y, s] of [
      [1, 1, 0.5],
      [0.1, 0.2, 1],
      [2, 1.5, 3],
      [0.001, 0.001, 0.2],
    ]) {
      expect(gaussianEdgeMass(w, x, y, s)).toBeCloseTo(boxMass(x, y, s, 0, 4, 0, 3), 6); // jstat's Φ is good to ~1e-7
    }
  });

  it("in an L-shaped trench with a hole equals the sum over its rectangles", () => {
    // L = [0,10]×[0,4] ∪ [0,4]×[4,10] minus the hole [6,8]×[1,2]
    const w = createWindow({
      outer: [
        [0, 0],
        [10, 0],
        [10, 4],
        [4, 4],
        [4, 10],
        [0, 10],
      ],
      holes: [
        [
          [6, 1],
          [8, 1],
          [8, 2],
          [6, 2],
        ],
      ],
    });
    for (const [x, y, s] of [
      [3.5, 3.5, 1],
      [5, 3, 2],
      [2, 9, 0.7],
      [7, 2.5, 0.3],
    ]) {
      const expected = boxMass(x, y, s, 0, 10, 0, 4) + boxMass(x, y, s, 0, 4, 4, 10) - boxMass(x, y, s, 6, 8, 1, 2);
      expect(gaussianEdgeMass(w, x, y, s)).toBeCloseTo(expected, 6);
    }
  });
});

describe("intensityAtPoints", () => {
  const big = rectangleWindow(0, 0, 100, 100);
  it("leave-one-out Gaussian sum without edge correction (hand formula)", () => {
    const res = intensityAtPoints(big, { x: [50, 53], y: [50, 54] }, { sigma: 2, edge: "none" });
    const k = Math.exp(-25 / 8) / (2 * Math.PI * 4); // φ_σ at distance 5
    expect(res.values[0]).toBeCloseTo(k, 15);
    expect(res.values[1]).toBeCloseTo(k, 15);
    const withSelf = intensityAtPoints(
      big,
      { x: [50, 53], y: [50, 54] },
      { sigma: 2, edge: "none", leaveOneOut: false },
    );
    expect(withSelf.values[0]).toBeCloseTo(k + 1 / (8 * Math.PI), 15);
  });

  it("divides by e(x_i) with the uniform edge correction", () => {
    const w = rectangleWindow(0, 0, 10, 10);
    const res = intensityAtPoints(w, { x: [0.5, 1.5], y: [5, 5] }, { sigma: 1, edge: "uniform" });
    const k = Math.exp(-0.5) / (2 * Math.PI);
    expect(res.values[0]).toBeCloseTo(k / boxMass(0.5, 5, 1, 0, 10, 0, 10), 6);
  });

  it("uses Scott's rule σ = √(s_x s_y)·n^(−1/6) by default (Scott 1992; spatstat bw.scott)", () => {
    const pts = { x: Float64Array.from([0, 2, 0, 2]), y: Float64Array.from([0, 0, 2, 2]) };
    expect(scottBandwidth(pts)).toBeCloseTo(Math.sqrt(4 / 3) * 4 ** (-1 / 6), 12);
    expect(intensityAtPoints(rectangleWindow(-1, -1, 3, 3), pts).sigma).toBeCloseTo(scottBandwidth(pts), 12);
  });

  it("refuses a bandwidth that leaves a find with intensity 0, and a bad bandwidth", () => {
    expect(() => intensityAtPoints(big, { x: [10, 90], y: [10, 90] }, { sigma: 1 })).toThrow(
      /intensity is 0 at find 1/,
    );
    expect(() => intensityAtPoints(big, { x: [10, 90], y: [10, 90] }, { sigma: -1 })).toThrow(/positive distance/);
  });
});

describe("densityGrid", () => {
  it("integrates to n with Diggle's edge correction (Σ_j ∫_W k(u − x_j) du / e(x_j) = n)", () => {
    const w = createWindow({
      outer: [
        [0, 0],
        [10, 0],
        [10, 4],
        [4, 4],
        [4, 10],
        [0, 10],
      ],
    });
    const pts = { x: [0.5, 1, 3, 8, 9.5, 2, 3.9], y: [0.5, 3, 9.5, 2, 3.5, 6, 4.1] };
    const g = densityGrid(w, pts, { sigma: 0.8, edge: "diggle", nx: 400 });
    const integral = g.values.reduce((s, v) => s + v, 0) * g.dx * g.dy;
    expect(integral).toBeCloseTo(7, 1); // midpoint rule on 2.5 cm pixels; pixel centres near the notch
    expect(Math.abs(integral - 7) / 7).toBeLessThan(0.01);
    expect(g.values[g.ny * g.nx - 1]).toBe(0); // top-right pixel lies in the notch, outside W
    expect(g.inside[g.ny * g.nx - 1]).toBe(0);
  });

  it("lays out square pixels over the bounding box", () => {
    const g = densityGrid(rectangleWindow(0, 0, 8, 4), { x: [1, 2], y: [1, 2] }, { sigma: 1, nx: 16 });
    expect([g.nx, g.ny, g.dx, g.dy]).toEqual([16, 8, 0.5, 0.5]);
    expect(g.max).toBeGreaterThan(0);
  });
});
