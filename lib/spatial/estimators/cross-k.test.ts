import { describe, expect, it } from "vitest";
import { createWindow, rectangleWindow } from "../geometry/window";
import { crossK, dotK, kDifference } from "./cross-k";
import { kFunction } from "./k-function";

const big = rectangleWindow(0, 0, 100, 100);
const A = { x: [50], y: [50] };
const B = { x: [51, 50], y: [50, 52] };
const r = [0, 1.5, 3];

describe("crossK", () => {
  it("divides by n_A·n_B/|W| over A→B pairs (Lotwick & Silverman 1982; spatstat Kcross), hand count", () => {
    const res = crossK(big, A, B, { r, correction: ["isotropic", "translation", "border"] });
    expect(Array.from(res.K.isotropic!)).toEqual([0, expect.closeTo(5000, 9), expect.closeTo(10000, 9)]);
    // border: numerator / (λ_B · #{A centres}) = count / (2/10⁴ · 1)
    expect(Array.from(res.K.border!)).toEqual([0, expect.closeTo(5000, 9), expect.closeTo(10000, 9)]);
    // translation: (5000)·(w(1,0) + w(0,2)) with w = ab/((a−|dx|)(b−|dy|))
    expect(res.K.translation![2]).toBeCloseTo(5000 * (1e4 / (99 * 100) + 1e4 / (100 * 98)), 9);
    expect(res.L.isotropic![2]).toBeCloseTo(Math.sqrt(10000 / Math.PI), 9);
  });

  it("centres the isotropic circle on the A point (asymmetric near an edge)", () => {
    const w = rectangleWindow(0, 0, 10, 10);
    const near = { x: [5], y: [0.5] };
    const far = { x: [5], y: [2.5] };
    const ab = crossK(w, near, far, { r: [0, 3] });
    const ba = crossK(w, far, near, { r: [0, 3] });
    const cut = (h: number) => (2 * Math.PI) / (2 * Math.PI - 2 * Math.acos(h / 2)); // Ripley 1977, one edge
    expect(ab.K.isotropic![1]).toBeCloseTo(100 * cut(0.5), 12);
    expect(ba.K.isotropic![1]).toBeCloseTo(100 * 1, 12); // circle of radius 2 around (5, 2.5) stays inside
  });

  it("refuses an empty class", () => {
    expect(() => crossK(big, A, { x: [], y: [] }, { r })).toThrow(/class B has no points/);
  });
});

describe("dotK", () => {
  it("pairs class A with every other find, divisor n_A·n/|W| (spatstat Kdot), hand count", () => {
    const all = { x: [50, 51, 50], y: [50, 50, 52] };
    const res = dotK(big, all, [true, false, false], { r });
    expect(res.K.isotropic![2]).toBeCloseTo((1e4 / 3) * 2, 9);
  });

  it("with every find in class A equals K·(n−1)/n (the divisors n² and n(n−1))", () => {
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
    const pts = { x: [1, 2.5, 3, 7, 9, 1.5, 3.2], y: [1, 2, 8, 3, 1, 6, 3.1] };
    const rr = Array.from({ length: 33 }, (_, k) => (k * 3) / 32);
    const dot = dotK(
      w,
      pts,
      pts.x.map(() => true),
      { r: rr, correction: ["isotropic", "translation"] },
    );
    const k = kFunction(w, pts, { r: rr, correction: ["isotropic", "translation"] });
    for (const c of ["isotropic", "translation"] as const) {
      dot.K[c]!.forEach((v, i) => expect(v).toBeCloseTo((k.K[c]![i] * 6) / 7, 9));
    }
  });

  it("refuses labels that do not match the finds, and a class with no finds", () => {
    expect(() => dotK(big, B, [true], { r })).toThrow(/2 finds but 1 class labels/);
    expect(() => dotK(big, B, [false, false], { r })).toThrow(/class A has no points/);
  });
});

describe("kDifference", () => {
  it("is K_AA − K_BB (Diggle & Chetwynd 1991) and vanishes for identical classes", () => {
    const w = rectangleWindow(0, 0, 10, 10);
    const a = { x: [1, 2, 3, 4], y: [1, 1.5, 1, 1.2] };
    const b = { x: [1, 5, 9, 5], y: [9, 5, 1, 8] };
    const rr = [0, 1, 2, 3];
    const same = kDifference(w, a, a, { r: rr });
    expect(Array.from(same.difference.isotropic!)).toEqual([0, 0, 0, 0]);
    const res = kDifference(w, a, b, { r: rr });
    const ka = kFunction(w, a, { r: rr }).K.isotropic!;
    const kb = kFunction(w, b, { r: rr }).K.isotropic!;
    res.difference.isotropic!.forEach((v, k) => expect(v).toBeCloseTo(ka[k] - kb[k], 12));
    expect(res.difference.isotropic![3]).toBeGreaterThan(0); // the clustered class A
  });
});
