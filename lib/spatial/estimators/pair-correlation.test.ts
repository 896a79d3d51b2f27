import { describe, expect, it } from "vitest";
import { rectangleWindow } from "../geometry/window";
import { pairCorrelation } from "./pair-correlation";

const big = rectangleWindow(0, 0, 100, 100);
const two = { x: [50, 51], y: [50, 50] };

describe("pairCorrelation", () => {
  it("is the Epanechnikov kernel sum with divisor r (Stoyan & Stoyan 1994), hand-computed", () => {
    const res = pairCorrelation(big, two, { r: [0, 0.5, 1, 1.25, 1.5], halfWidth: 0.5 });
    expect(Array.from(res.r)).toEqual([0.5, 1, 1.25, 1.5]); // g is undefined at r = 0
    const scale = 1e4 / (2 * Math.PI * 2); // |W| / (2π n(n−1))
    const k = (u: number) => (Math.abs(u) < 0.5 ? (0.75 * (1 - (u / 0.5) ** 2)) / 0.5 : 0);
    const expected = [0.5, 1, 1.25, 1.5].map((r) => (scale * 2 * k(r - 1)) / r);
    res.g.isotropic!.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 9));
    expect(res.g.isotropic![0]).toBe(0);
    expect(res.g.isotropic![3]).toBe(0); // |u| = h is outside the kernel's open support
  });

  it("uses Stoyan's half-width 0.15/√λ by default", () => {
    const res = pairCorrelation(big, two, { r: [0, 1] });
    expect(res.halfWidth).toBeCloseTo(0.15 / Math.sqrt(2 / 1e4), 12);
  });

  it("translation weights ab/((a−|dx|)(b−|dy|)) enter the sum (Ohser 1983)", () => {
    const res = pairCorrelation(big, two, { r: [1], halfWidth: 0.5, correction: "translation" });
    const w = 1e4 / (99 * 100);
    expect(res.g.translation![0]).toBeCloseTo((1e4 / (4 * Math.PI)) * 2 * w * 1.5, 9);
  });

  it("refuses the border correction and a non-positive bandwidth", () => {
    expect(() => pairCorrelation(big, two, { correction: "border" })).toThrow(/not border/);
    expect(() => pairCorrelation(big, two, { halfWidth: 0 })).toThrow(/half-width/);
  });
});
