import { describe, expect, it } from "vitest";
import { createWindow } from "@/lib/spatial";
import { clipSquares, MAX_GRID_SQUARES, parseSquareLabel, squareAt, squareLabel, SquareGridError } from "./square-grid";

/** The test fixtures' trench: 10 m × 6 m with a 2 m × 1 m baulk at x 4–6, y 2–3 (area 58 m²). */
const baulked = createWindow({
  outer: [
    [0, 0],
    [10, 0],
    [10, 6],
    [0, 6],
  ],
  holes: [
    [
      [4, 2],
      [4, 3],
      [6, 3],
      [6, 2],
    ],
  ],
});
const areaOf = (squares: { area: number }[]) => squares.reduce((s, q) => s + q.area, 0);

describe("square grid clipped to the trench", () => {
  it("drops the squares under a baulk and keeps 58 whole 1 m squares (worked by hand)", () => {
    const squares = clipSquares(baulked, { size: 1, originX: 0, originY: 0 });
    expect(squares).toHaveLength(58);
    expect(squares.every((s) => s.whole && Math.abs(s.area - 1) < 1e-12)).toBe(true);
    const labels = new Set(squares.map((s) => s.label));
    expect(labels.has("4/2")).toBe(false);
    expect(labels.has("5/2")).toBe(false);
    expect(labels.has("3/2")).toBe(true);
  });

  it("cuts edge squares when the grid origin is off the trench corner; the areas add up to the trench's", () => {
    const squares = clipSquares(baulked, { size: 1, originX: 0.5, originY: 0.25 });
    expect(areaOf(squares)).toBeCloseTo(58, 10);
    // South-west corner square (-0.5, -0.75) → (0.5, 0.25) holds 0.5 × 0.25 m of the trench.
    const corner = squares.find((s) => s.label === "-0.5/-0.75")!;
    expect(corner.area).toBeCloseTo(0.125, 12);
    expect(corner.whole).toBe(false);
    // Square 3.5/1.25 → 4.5/2.25: its north-east 0.5 × 0.25 lies under the baulk.
    expect(squares.find((s) => s.label === "3.5/1.25")!.area).toBeCloseTo(1 - 0.125, 12);
  });

  it("gives a concave trench's squares their exact clipped area (triangle halves by hand)", () => {
    // Right triangle with legs 2 m: squares on the diagonal are half inside.
    const tri = createWindow({
      outer: [
        [0, 0],
        [2, 0],
        [0, 2],
      ],
    });
    const squares = clipSquares(tri, { size: 1, originX: 0, originY: 0 });
    const byLabel = Object.fromEntries(squares.map((s) => [s.label, s.area]));
    expect(byLabel).toEqual({ "0/0": 1, "1/0": 0.5, "0/1": 0.5 });
    // An L-shaped trench (5 m² in 0.5 m squares): 20 whole squares.
    const ell = createWindow({
      outer: [
        [0, 0],
        [3, 0],
        [3, 1],
        [1, 1],
        [1, 3],
        [0, 3],
      ],
    });
    const half = clipSquares(ell, { size: 0.5, originX: 0, originY: 0 });
    expect(half).toHaveLength(20);
    expect(areaOf(half)).toBeCloseTo(5, 12);
  });

  it("refuses a grid too fine for the trench, naming the count", () => {
    expect(() => clipSquares(baulked, { size: 0.01, originX: 0, originY: 0 })).toThrow(SquareGridError);
    expect(() => clipSquares(baulked, { size: 0.01, originX: 0, originY: 0 })).toThrow(
      /600,000 squares; at most 20,000/,
    );
    expect(MAX_GRID_SQUARES).toBe(20_000);
    expect(() => clipSquares(baulked, { size: 0, originX: 0, originY: 0 })).toThrow(/positive number/);
  });
});

describe("square names", () => {
  const grid = { size: 0.5, originX: 100, originY: 200 };
  it("names a square by its south-west corner and reads the name back", () => {
    expect(squareLabel(grid, 3, -2)).toBe("101.5/199");
    expect(parseSquareLabel(grid, "101.5/199")).toEqual({ col: 3, row: -2 });
    expect(parseSquareLabel(grid, " 101.5, 199 ")).toEqual({ col: 3, row: -2 });
    expect(parseSquareLabel(grid, "101.25/199")).toBeNull();
    expect(parseSquareLabel(grid, "A4")).toBeNull();
  });
  it("puts a point on a grid line in the square to its north and east", () => {
    expect(squareAt(grid, 101.5, 199)).toEqual({ col: 3, row: -2 });
    expect(squareAt(grid, 101.49, 198.99)).toEqual({ col: 2, row: -3 });
  });
});
