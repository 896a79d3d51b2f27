import { describe, expect, it } from "vitest";
import { createWindow, rectangleWindow } from "../geometry/window";
import { createQuadratLayout, quadratTest } from "./quadrat";

const ell = [
  [0, 0],
  [10, 0],
  [10, 4],
  [4, 4],
  [4, 10],
  [0, 10],
] as [number, number][];

describe("quadrat layout", () => {
  it("clips cells to the trench exactly and drops cells outside it (hand geometry)", () => {
    const layout = createQuadratLayout(createWindow({ outer: ell }), 2, 2);
    // top row: [0,5]×[5,10] ∩ L = [0,4]×[5,10] = 20; [5,10]×[5,10] is the notch: dropped
    // bottom row: [0,5]×[0,5] ∩ L = 5·4 + 4·1 = 24; [5,10]×[0,5] ∩ L = 5·4 = 20
    expect(layout.cells.map((c) => [c.row, c.col, c.area])).toEqual([
      [1, 1, expect.closeTo(20, 12)],
      [2, 1, expect.closeTo(24, 12)],
      [2, 2, expect.closeTo(20, 12)],
    ]);
    expect(layout.cells.map((c) => c.whole)).toEqual([false, false, false]);
  });

  it("subtracts holes from the cells they fall in", () => {
    const w = createWindow({
      outer: ell,
      holes: [
        [
          [6, 1],
          [8, 1],
          [8, 3],
          [6, 3],
        ],
      ],
    });
    const layout = createQuadratLayout(w, 2, 2);
    expect(layout.cells[2].area).toBeCloseTo(16, 12); // 20 − the 2 × 2 hole
  });
});

describe("quadratTest", () => {
  it("gives Pearson's X², df and χ² p for a hand-counted grid (Greig-Smith 1952)", () => {
    const w = rectangleWindow(0, 0, 4, 2);
    const res = quadratTest(w, { x: [0.5, 1, 1.5, 3], y: [1, 1, 1, 1] }, { nx: 2, ny: 1 });
    expect(Array.from(res.observed)).toEqual([3, 1]);
    expect(Array.from(res.expected)).toEqual([2, 2]);
    expect(res.X2).toBeCloseTo(1, 12); // (3−2)²/2 + (1−2)²/2
    expect(res.df).toBe(1);
    // P(χ²₁ > 1) = 2(1 − Φ(1)) = 0.31731 (standard normal table)
    expect(res.pClustered).toBeCloseTo(0.31731, 5);
    expect(res.p).toBeCloseTo(2 * 0.31731, 4); // two-sided: 2·min(upper, lower)
    expect(res.varianceMeanRatio).toBeCloseTo(1, 12); // variance 2 (n − 1 divisor), mean 2
    expect(res.smallExpected).toBe(true);
    expect(res.minExpected).toBe(2);
  });

  it("puts a find on a cell line in the cell below/left (R's cut, include.lowest)", () => {
    const w = rectangleWindow(0, 0, 4, 2);
    const res = quadratTest(w, { x: [2, 0, 4, 4], y: [1, 0, 2, 0] }, { nx: 2, ny: 1 });
    expect(Array.from(res.observed)).toEqual([2, 2]);
    expect(res.X2).toBe(0);
    expect(res.pRegular).toBe(0);
  });

  it("chooses the one-sided p on request", () => {
    const w = rectangleWindow(0, 0, 4, 2);
    const pts = { x: [0.5, 1, 1.5, 3], y: [1, 1, 1, 1] };
    expect(quadratTest(w, pts, { nx: 2, ny: 1, alternative: "regular" }).p).toBeCloseTo(1 - 0.31731, 5);
  });

  it("refuses a grid without whole cells or with one cell", () => {
    const w = rectangleWindow(0, 0, 4, 2);
    expect(() => quadratTest(w, { x: [1, 2], y: [1, 1] }, { nx: 0 })).toThrow(/whole number of cells/);
    expect(() => quadratTest(w, { x: [1, 2], y: [1, 1] }, { nx: 1, ny: 1 })).toThrow(/at least 2 cells/);
  });
});
