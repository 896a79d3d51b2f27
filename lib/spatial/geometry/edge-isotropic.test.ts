import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { createWindow, rectangleWindow } from "./window";
import { isotropicPairWeights, isotropicWeight } from "./edge-isotropic";
import { pairsWithin } from "./neighbours";

const square = rectangleWindow(0, 0, 10, 10);

describe("isotropic edge weight", () => {
  it("is 1 when the circle lies inside W", () => {
    expect(isotropicWeight(square, 5, 5, 3)).toBe(1);
  });

  it("at a straight edge is 2π / (2π − 2·acos(d/r)) (Ripley 1977, circle cut by one line)", () => {
    for (const [d, r] of [
      [1, 2],
      [0.5, 3],
      [2.9, 3],
    ]) {
      const expected = (2 * Math.PI) / (2 * Math.PI - 2 * Math.acos(d / r));
      expect(isotropicWeight(square, 5, d, r)).toBeCloseTo(expected, 12);
      expect(isotropicWeight(square, 10 - d, 5, r)).toBeCloseTo(expected, 12);
    }
  });

  it("at a corner removes both cut arcs once (hand geometry: 360° / 150° = 2.4)", () => {
    // Centre (1, 1), r = 2: each edge cuts 120° (2·acos(1/2)); the two arcs share 30°, so 210° lie outside.
    expect(isotropicWeight(square, 1, 1, 2)).toBeCloseTo(2.4, 12);
  });

  it("counts the arc lost in a hole (hand geometry)", () => {
    // Hole [12,14]×[4,6] in [0,20]²; centre (10, 5), r = 4, every outer edge at least 5 away. The circle
    // point (10 + 4cosφ, 5 + 4sinφ) is in the hole when cosφ ≥ 1/2 and |sinφ| ≤ 1/4: |φ| ≤ asin(1/4).
    const w = createWindow({
      outer: [
        [0, 0],
        [20, 0],
        [20, 20],
        [0, 20],
      ],
      holes: [
        [
          [12, 4],
          [14, 4],
          [14, 6],
          [12, 6],
        ],
      ],
    });
    const lost = 2 * Math.asin(0.25);
    expect(isotropicWeight(w, 10, 5, 4)).toBeCloseTo((2 * Math.PI) / (2 * Math.PI - lost), 12);
  });

  it("in a concave outline adds back the arc that re-enters W (L-shape, hand geometry)", () => {
    // L = [0,10]×[0,4] ∪ [0,4]×[4,10]. Centre (2, 2), r = 2.5: the bottom and left edges cut as in the
    // square's corner; the notch corner (4, 4) is √8 ≈ 2.83 away, out of reach: same weight as the square.
    const ell = createWindow({
      outer: [
        [0, 0],
        [10, 0],
        [10, 4],
        [4, 4],
        [4, 10],
        [0, 10],
      ],
    });
    expect(isotropicWeight(ell, 2, 2, 2.5)).toBeCloseTo(isotropicWeight(square, 2, 2, 2.5), 12);
    // Centre (3, 3), r = 2: the outer edges are 3 away; the circle point (3 + 2cosφ, 3 + 2sinφ) is in the
    // notch (x > 4 and y > 4) when cosφ > 1/2 and sinφ > 1/2, i.e. 30° < φ < 60°: π/6 is lost.
    expect(isotropicWeight(ell, 3, 3, 2)).toBeCloseTo((2 * Math.PI) / (2 * Math.PI - Math.PI / 6), 12);
  });

  it("handles finds digitised on the trench edge: half the circle inside on an edge, a quarter at a corner", () => {
    expect(isotropicWeight(square, 5, 0, 1)).toBeCloseTo(2, 12); // θ = π
    expect(isotropicWeight(square, 0, 0, 1)).toBeCloseTo(4, 12); // θ = π/2
    const ell = createWindow({
      outer: [
        [0, 0],
        [10, 0],
        [10, 4],
        [4, 4],
        [4, 10],
        [0, 10],
      ],
    });
    expect(isotropicWeight(ell, 4, 4, 1)).toBeCloseTo(4 / 3, 12); // reflex corner: θ = 3π/2
    // at r larger than the distance to the far side of the notch the arc is still counted exactly:
    // centre (4, 4), r = 1.5 in L: the inside directions are 90°…360° (the notch is 0°…90°)
    expect(isotropicWeight(ell, 4, 4, 1.5)).toBeCloseTo(4 / 3, 12);
  });

  it("is clamped to 100 at a sharp corner and to at least 1", () => {
    const thin = createWindow({
      outer: [
        [0, 0],
        [100, 0],
        [0, 0.01],
      ],
    });
    expect(isotropicWeight(thin, 0.001, 0.001, 50)).toBe(100);
  });

  it("agrees with the closed-form rectangle weight for random centres and radii (property)", () => {
    // Independent formula for rectangles: each edge cuts the half-angle acos(d/r), limited on either side by
    // the direction to that edge's corners (Ripley 1977; the rectangle case as spatstat's Krect computes it).
    const a = 6,
      b = 4;
    const w = rectangleWindow(0, 0, a, b);
    const hang = (d: number, r: number) => (d < r ? Math.acos(d / r) : 0);
    const rect = (x: number, y: number, r: number) => {
      const [dL, dR, dD, dU] = [x, a - x, y, b - y];
      const cL = Math.min(hang(dL, r), Math.atan2(dU, dL)) + Math.min(hang(dL, r), Math.atan2(dD, dL));
      const cR = Math.min(hang(dR, r), Math.atan2(dU, dR)) + Math.min(hang(dR, r), Math.atan2(dD, dR));
      const cU = Math.min(hang(dU, r), Math.atan2(dL, dU)) + Math.min(hang(dU, r), Math.atan2(dR, dU));
      const cD = Math.min(hang(dD, r), Math.atan2(dL, dD)) + Math.min(hang(dD, r), Math.atan2(dR, dD));
      const inside = 1 - (cL + cR + cU + cD) / (2 * Math.PI);
      return inside <= 0.01 ? 100 : Math.max(1, 1 / inside); // clamped to [1, 100] as spatstat's edge.Ripley
    };
    const unit = fc.double({ min: 0.01, max: 0.99, noNaN: true });
    fc.assert(
      fc.property(unit, unit, fc.double({ min: 0.01, max: 7, noNaN: true }), (u, v, r) => {
        expect(isotropicWeight(w, u * a, v * b, r)).toBeCloseTo(rect(u * a, v * b, r), 9);
      }),
      { numRuns: 500 },
    );
  });

  it("gives per-pair weights in both directions", () => {
    const x = Float64Array.from([5, 5]);
    const y = Float64Array.from([1, 3]);
    const pairs = pairsWithin({ x, y }, 3);
    const w = isotropicPairWeights(square, x, y, 2, pairs, 3);
    expect(w[0]).toBeCloseTo((2 * Math.PI) / (2 * Math.PI - 2 * Math.acos(1 / 2)), 12); // centre (5,1)
    expect(w[1]).toBe(1); // centre (5,3): distance 3 to the edge, circle of radius 2 inside
  });
});
