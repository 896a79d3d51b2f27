import { describe, expect, it } from "vitest";
import { rectangleWindow } from "../geometry/window";
import { CLARK_EVANS_SE_CONSTANT, clarkEvans, meanNearestNeighbour } from "./clark-evans";

// A 4 × 4 lattice of spacing 1 in [0,4]²: every nearest-neighbour distance is 1, λ = 1.
const square = rectangleWindow(0, 0, 4, 4);
const lattice = { x: [] as number[], y: [] as number[] };
for (let i = 0; i < 4; i++) {
  for (let j = 0; j < 4; j++) {
    lattice.x.push(i + 0.5);
    lattice.y.push(j + 0.5);
  }
}

describe("clarkEvans", () => {
  it("uses Clark & Evans' (1954) constant 0.26136 = √((4−π)/(4π))", () => {
    expect(CLARK_EVANS_SE_CONSTANT).toBeCloseTo(0.26136, 5);
  });

  it("gives E = 1/(2√λ), R = d̄·2√λ and SE = 0.26136/√(nλ) (Clark & Evans 1954) on a lattice", () => {
    const ce = clarkEvans(square, lattice, { alternative: "regular" });
    expect(ce.meanNN).toBeCloseTo(1, 12);
    expect(ce.expected).toBeCloseTo(0.5, 12);
    expect(ce.R).toBeCloseTo(2, 12);
    expect(ce.se).toBeCloseTo(0.26136 / 4, 5);
    expect(ce.z).toBeCloseTo(0.5 / (CLARK_EVANS_SE_CONSTANT / 4), 10);
    expect(ce.p).toBe(ce.pRegular);
    expect(ce.pRegular).toBeLessThan(1e-12);
    expect(ce.pClustered).toBeCloseTo(1, 12);
    expect(ce.pTwoSided).toBeCloseTo(2 * ce.pRegular, 20);
  });

  it("gives Donnelly's (1978) mean and variance, labelled an approximation", () => {
    const ce = clarkEvans(square, lattice);
    // A = 16, P = 16, n = 16: E = 0.5·1 + (0.0514 + 0.041/4)·1; Var = 0.07·16/256 + 0.037·16·√(16/16⁵)
    expect(ce.donnelly.expected).toBeCloseTo(0.56165, 12);
    expect(ce.donnelly.se).toBeCloseTo(Math.sqrt(0.004375 + 0.0023125), 12);
    expect(ce.donnelly.approximate).toBe(true);
    expect(ce.donnelly.note).toMatch(/rectangular/);
  });

  it("p-values of the standard normal: z = 0 gives 1 two-sided and ½ one-sided (jstat)", () => {
    // two finds 0.5·√(A/n)·… chosen so that d̄ = 1/(2√λ): A = 16, n = 2 → E = √2, so place them √2 apart
    const ce = clarkEvans(square, { x: [1, 2], y: [1, 2] });
    expect(ce.z).toBeCloseTo(0, 12);
    expect(ce.pTwoSided).toBeCloseTo(1, 9);
    expect(ce.pClustered).toBeCloseTo(0.5, 9);
    // Φ(−1.959964) = 0.025 (standard normal table)
    const w = rectangleWindow(0, 0, 100, 100);
    const se = (CLARK_EVANS_SE_CONSTANT * Math.sqrt(1e4)) / 2;
    const d = 1 / (2 * Math.sqrt(2 / 1e4)) - 1.959964 * se;
    const res = clarkEvans(w, { x: [50, 50 + d], y: [50, 50] }, { alternative: "clustered" });
    expect(res.p).toBeCloseTo(0.025, 6);
  });

  it("meanNearestNeighbour is d̄", () => {
    expect(meanNearestNeighbour(square, { x: [1, 2, 3.5], y: [1, 1, 1] })).toBeCloseTo((1 + 1 + 1.5) / 3, 12);
  });

  it("refuses fewer than 2 finds and identical finds", () => {
    expect(() => clarkEvans(square, { x: [1], y: [1] })).toThrow(/at least 2/);
    expect(() => clarkEvans(square, { x: [1, 1], y: [1, 1] })).toThrow(/same place/);
  });
});
