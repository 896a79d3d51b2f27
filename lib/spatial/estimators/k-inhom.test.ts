import { describe, expect, it } from "vitest";
import { createWindow } from "../geometry/window";
import { kInhom } from "./k-inhom";
import { kFunction } from "./k-function";

const ell = createWindow({
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
      [8, 2.5],
      [6, 2.5],
    ],
  ],
});
const pts = { x: [1, 2.5, 3, 7, 9, 1.5, 3.2, 5, 2, 0.4], y: [1, 2, 8, 3, 1, 6, 3.1, 0.5, 9.5, 4] };
const r = Array.from({ length: 33 }, (_, k) => (k * 3) / 32);

describe("kInhom", () => {
  it("with constant λ = n/|W| equals K·(n−1)/n, renormalised or not (Baddeley, Møller & Waagepetersen 2000)", () => {
    const n = pts.x.length;
    const lambda = pts.x.map(() => n / ell.area);
    const k = kFunction(ell, pts, { r, correction: ["isotropic", "translation"] });
    for (const renormalise of [true, false]) {
      const ki = kInhom(ell, pts, { r, lambda, renormalise, correction: ["isotropic", "translation"] });
      for (const c of ["isotropic", "translation"] as const) {
        ki.K[c]!.forEach((v, i) => expect(v).toBeCloseTo((k.K[c]![i] * (n - 1)) / n, 9));
      }
    }
  });

  it("weights pairs by 1/(λ_i λ_j) (hand check: doubling λ everywhere quarters K when not renormalised)", () => {
    const lambda = pts.x.map((_, k) => 0.1 + 0.02 * k);
    const a = kInhom(ell, pts, { r, lambda, renormalise: false });
    const b = kInhom(ell, pts, { r, lambda: lambda.map((v) => 2 * v), renormalise: false });
    a.K.isotropic!.forEach((v, i) => expect(b.K.isotropic![i]).toBeCloseTo(v / 4, 12));
    // renormalised, the divisor Σ 1/λ_i halves too (spatstat's normpower 1), so K halves
    const c = kInhom(ell, pts, { r, lambda });
    const d = kInhom(ell, pts, { r, lambda: lambda.map((v) => 2 * v) });
    c.K.isotropic!.forEach((v, i) => expect(d.K.isotropic![i]).toBeCloseTo(v / 2, 12));
    const divisor = lambda.reduce((s, v) => s + 1 / v, 0);
    c.K.isotropic!.forEach((v, i) => expect(v).toBeCloseTo((a.K.isotropic![i] * ell.area) / divisor, 12));
  });

  it("estimates λ with the leave-one-out kernel when none is given, and says which σ", () => {
    const res = kInhom(ell, pts, { r, intensity: { sigma: 3 } });
    expect(res.sigma).toBe(3);
    expect(res.K.isotropic!.every(Number.isFinite)).toBe(true);
  });

  it("refuses bad intensities and the border correction", () => {
    expect(() => kInhom(ell, pts, { r, lambda: [1, 2] })).toThrow(/10 finds but 2 intensity values/);
    expect(() => kInhom(ell, pts, { r, lambda: pts.x.map(() => 0) })).toThrow(/must be positive/);
    expect(() => kInhom(ell, pts, { r, lambda: pts.x.map(() => 1), correction: "border" })).toThrow(/not border/);
  });
});
