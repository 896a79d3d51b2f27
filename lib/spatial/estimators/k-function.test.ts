import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { createWindow, rectangleWindow } from "../geometry/window";
import { kFunction, kToL, lFunction } from "./k-function";
import { SpatialInputError } from "../errors";

// Three finds far from the edges of a 100 m square: distances 1 (pair 0–1), 2 (0–2) and √5 (1–2).
const big = rectangleWindow(0, 0, 100, 100);
const tiny = { x: [50, 51, 50], y: [50, 50, 52] };
const r = [0, 0.5, 1, 1.5, 2, 2.1, 2.5, 3];

describe("kFunction", () => {
  it("isotropic K of a hand-counted pattern: |W|/(n(n−1)) · #{ordered pairs, d < r} (Ripley 1977; spatstat's n(n−1))", () => {
    const { K, lambda } = kFunction(big, tiny, { r, correction: "isotropic" });
    // every circle lies inside W, so every weight is 1; distances equal to a grid value count only above it
    const counts = [0, 0, 0, 2, 2, 4, 6, 6];
    expect(Array.from(K.isotropic!)).toEqual(counts.map((c) => expect.closeTo((10000 / 6) * c, 9)));
    expect(lambda).toBeCloseTo(3 / 10000, 15);
  });

  it("border K divides by λ·#{b_i ≥ r} with λ = n/|W| (Ripley 1977 reduced sample; spatstat Kborder)", () => {
    const { K } = kFunction(big, tiny, { r, correction: "border" });
    const counts = [0, 0, 0, 2, 2, 4, 6, 6];
    expect(Array.from(K.border!)).toEqual(counts.map((c) => expect.closeTo((c * 10000) / 9, 9)));
  });

  it("translation K sums |W|/|W ∩ (W+v)| over ordered pairs (Ohser 1983)", () => {
    const { K } = kFunction(big, tiny, { r, correction: "translation" });
    const w1 = 1e4 / (99 * 100); // v = (1, 0)
    const w2 = 1e4 / (100 * 98); // v = (0, 2)
    const w3 = 1e4 / (99 * 98); // v = (−1, 2)
    const s = 1e4 / 6;
    expect(K.translation![3]).toBeCloseTo(s * 2 * w1, 9);
    expect(K.translation![5]).toBeCloseTo(s * 2 * (w1 + w2), 9);
    expect(K.translation![7]).toBeCloseTo(s * 2 * (w1 + w2 + w3), 9);
  });

  it("border correction drops centres nearer the edge than r (hand count)", () => {
    // Square [0,10]²: point 0 at (1, 5) has b = 1, points 1, 2 at (2, 5), (5, 5) have b = 2 and 5.
    const w = rectangleWindow(0, 0, 10, 10);
    const pts = { x: [1, 2, 5], y: [5, 5, 5] };
    const { K } = kFunction(w, pts, { r: [0, 1.5, 2, 3.5], correction: "border" });
    const lambda = 3 / 100;
    // r = 1.5 (previous grid value 0): all 3 centres count; ordered pairs with d < 1.5 and d ≤ b_i: 0→1 (d 1 ≤ 1), 1→0.
    expect(K.border![1]).toBeCloseTo(2 / (lambda * 3), 12);
    // r = 2 (previous 1.5): centres with b ≥ 1.5 are 1, 2; pairs 1→0 only (d < 2): 1 / (λ·2)
    expect(K.border![2]).toBeCloseTo(1 / (lambda * 2), 12);
    // r = 3.5 (previous 2): centres 1, 2; pairs with d < 3.5, d ≤ b_i, centre b ≥ 2: 1→0 (1), 2→1 (3 ≤ 5) → 2
    expect(K.border![3]).toBeCloseTo(2 / (lambda * 2), 12);
  });

  it("follows spatstat's two binning rules: generic (d < r) and rectangle on an even grid (d ≤ r)", () => {
    const pts = { x: [1, 2, 5], y: [5, 5, 5] };
    // Expected values: spatstat 3.0.3 (R 4.2.2), Kest(ppp(c(1,2,5), c(5,5,5), owin(c(0,10), c(0,10))),
    // r = ..., correction = c("iso", "border")), run by hand for this test; they also follow by hand from
    // the rules in r-grid.ts (λ = 0.03).
    const rect = rectangleWindow(0, 0, 10, 10);
    const even = kFunction(rect, pts, { r: [0, 1, 2, 3], correction: ["border", "isotropic"] });
    expect(Array.from(even.K.border!)).toEqual([0, expect.closeTo(16.66667, 4), 0, 0]);
    expect(even.K.isotropic![1]).toBeCloseTo(33.33333, 4);
    const uneven = kFunction(rect, pts, { r: [0, 1, 2, 3.5], correction: ["border", "isotropic"] });
    expect(Array.from(uneven.K.border!)).toEqual([0, 0, expect.closeTo(22.22222, 4), expect.closeTo(33.33333, 4)]);
    expect(uneven.K.isotropic![1]).toBe(0);
    expect(uneven.K.isotropic![3]).toBeCloseTo(72.75998, 4);
  });

  it("L = √(K/π) (Besag 1977)", () => {
    const K = Float64Array.from([0, Math.PI, 4 * Math.PI]);
    expect(Array.from(kToL(K))).toEqual([0, 1, 2]);
    const res = lFunction(big, tiny, { r });
    expect(res.L.isotropic![7]).toBeCloseTo(Math.sqrt(10000 / Math.PI), 9);
    expect(Array.from(res.theo)).toEqual(r);
  });

  it("default r grid has 513 values up to min(short side/4, √(1000/(πλ))) (spatstat rmax.rule)", () => {
    const w = rectangleWindow(0, 0, 20, 8);
    const pts = { x: [1, 5, 9, 13, 17, 3], y: [1, 7, 2, 6, 3, 4] };
    const res = kFunction(w, pts);
    expect(res.r.length).toBe(513);
    expect(res.r[512]).toBeCloseTo(Math.min(8 / 4, Math.sqrt(1000 / (Math.PI * (6 / 160)))), 12);
  });

  it("K is non-decreasing in r for isotropic and translation corrections (property)", () => {
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
    const coord = fc.tuple(fc.double({ min: 0, max: 10, noNaN: true }), fc.double({ min: 0, max: 10, noNaN: true }));
    fc.assert(
      fc.property(fc.array(coord, { minLength: 3, maxLength: 60 }), (raw) => {
        const inside = raw.filter(([x, y]) => ell.contains(x, y));
        fc.pre(inside.length >= 2 && new Set(inside.map((p) => p.join())).size > 1);
        const res = kFunction(
          ell,
          { x: inside.map((p) => p[0]), y: inside.map((p) => p[1]) },
          {
            r: Array.from({ length: 65 }, (_, k) => (k * 5) / 64),
            correction: ["isotropic", "translation"],
          },
        );
        for (const values of [res.K.isotropic!, res.K.translation!]) {
          for (let k = 1; k < values.length; k++) expect(values[k]).toBeGreaterThanOrEqual(values[k - 1]);
          expect(values.every(Number.isFinite)).toBe(true);
        }
      }),
      { numRuns: 100 },
    );
  });

  it("does not depend on where the site grid puts the trench (national-grid offsets)", () => {
    const outer: [number, number][] = [
      [0, 0],
      [10, 0],
      [10, 4],
      [4, 4],
      [4, 10],
      [0, 10],
    ];
    const hole: [number, number][] = [
      [6, 1],
      [8, 1],
      [8, 2.5],
      [6, 2.5],
    ];
    const pts = { x: [1, 2.5, 3, 7, 9, 1.5, 3.2, 5, 2, 0.4], y: [1, 2, 8, 3, 1, 6, 3.1, 0.5, 9.5, 4] };
    const [ex, ny] = [451234.5, 6123456.25];
    const shift = (r: [number, number][]) => r.map(([x, y]) => [x + ex, y + ny] as [number, number]);
    const rr = Array.from({ length: 17 }, (_, k) => (k * 2) / 16);
    const corr = ["isotropic", "translation", "border"] as const;
    const local = kFunction(createWindow({ outer, holes: [hole] }), pts, { r: rr, correction: [...corr] });
    const far = kFunction(
      createWindow({ outer: shift(outer), holes: [shift(hole)] }),
      { x: pts.x.map((v) => v + ex), y: pts.y.map((v) => v + ny) },
      { r: rr, correction: [...corr] },
    );
    for (const c of corr) local.K[c]!.forEach((v, k) => expect(far.K[c]![k]).toBeCloseTo(v, 6));
  });

  it("refuses bad input with a message naming the problem", () => {
    const w = rectangleWindow(0, 0, 10, 10);
    expect(() => kFunction(w, { x: [1], y: [1] })).toThrow(/has 1 point\(s\); this test needs at least 2/);
    expect(() => kFunction(w, { x: [], y: [] })).toThrow(/no points/);
    expect(() => kFunction(w, { x: [2, 2, 2], y: [3, 3, 3] })).toThrow(/same place/);
    expect(() => kFunction(w, { x: [2, 12], y: [3, 3] })).toThrow(/Point 2 .* outside the trench/);
    expect(() => kFunction(w, { x: [2, 5], y: [3, NaN] })).toThrow(/not a finite number/);
    expect(() => kFunction(w, { x: [2, 5], y: [3, 4] }, { r: [0, 1, 20] })).toThrow(/beyond the trench window/);
    expect(() => kFunction(w, { x: [2, 5], y: [3, 4] }, { r: [0.5, 1] })).toThrow(/must start at 0/);
    expect(() => kFunction(w, { x: [2, 5], y: [3, 4] }, { r: [0, 2, 1] })).toThrow(/increase strictly/);
    expect(() => kFunction(w, { x: [2, 5], y: [3, 4] }, { correction: "ripley" as never })).toThrow(SpatialInputError);
  });

  it("border: K is NaN (spatstat's NA) where no point is deep enough, on the default grid as on a given one", () => {
    const w = rectangleWindow(0, 0, 40, 40);
    const res = kFunction(w, { x: [1, 2, 3], y: [1, 2, 2] }, { correction: ["border", "isotropic"] });
    expect(res.r[512]).toBeCloseTo(10, 9); // spatstat's default r max (a quarter of the side), not capped
    // rectangle rule (spatstat's Krect): a centre counts at r while r < b; the deepest point is 2 from the edge
    expect(Array.from(res.K.border!, Number.isFinite)).toEqual(Array.from(res.r, (r) => r < 2));
    expect(res.K.isotropic!.every(Number.isFinite)).toBe(true);
    // generic rule (uneven grid): a centre counts at r_k while b ≥ r_(k−1); b = 1 and 2 here
    const given = kFunction(
      rectangleWindow(0, 0, 10, 10),
      { x: [1, 2], y: [1, 2] },
      { r: [0, 1, 2.5, 3], correction: "border" },
    );
    expect(Array.from(given.K.border!, Number.isFinite)).toEqual([true, true, true, false]);
  });
});
