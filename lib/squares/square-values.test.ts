import { describe, expect, it } from "vitest";
import { createWindow } from "@/lib/spatial";
import { clipSquares } from "@/lib/geometry/square-grid";
import { cellValue, findCells, latticeSquares, squareCells, type SampleLike } from "./square-values";
import { classBreaks, classLabels, classOf, viridis, VIRIDIS_STOPS } from "./colour-classes";

const grid = { size: 1, originX: 0, originY: 0 };
// 3 m × 1 m trench, the east square half cut away: squares 0/0, 1/0 (1 m²) and 2/0 (0.5 m²).
const squares = clipSquares(
  createWindow({
    outer: [
      [0, 0],
      [2.5, 0],
      [2.5, 1],
      [0, 1],
    ],
  }),
  grid,
);
const sample = (
  col: number,
  contextId: string,
  spitId: string | null,
  area: number,
  counts: SampleLike["counts"],
): SampleLike => ({ col, row: 0, contextId, spitId, area, outside: false, counts });

describe("squares by class", () => {
  const samples = [
    sample(0, "c1", "s1", 1, [{ classId: "FL", count: 4, weightG: 10 }]),
    sample(0, "c1", "s2", 0.5, [{ classId: "FL", count: 2, weightG: null }]),
    sample(1, "c1", "s1", 1, [{ classId: "BB", count: 3, weightG: null }]),
    sample(2, "c1", "s1", 0.5, [{ classId: "FL", count: 0, weightG: null }]),
  ];
  it("sums a square's spits, counts and areas dug alike, and tells 0 from not counted and not dug", () => {
    const cells = squareCells(squares, samples, { classId: "FL" });
    expect(cells.map((c) => [c.label, c.state, c.count, c.excavated])).toEqual([
      ["0/0", "counted", 6, 1.5],
      ["1/0", "not-counted", null, 1],
      ["2/0", "counted", 0, 0.5],
    ]);
    expect(cells[0]!.weightG).toBe(10);
    expect(cellValue(cells[2]!, "density")).toBe(0);
    // 4 flakes in spit 1's 1 m² and 2 in spit 2's 0.5 m²: 6 in 1.5 m² dug, 4 per m² (not 6, as if dug once).
    expect(cellValue(cells[0]!, "density")).toBe(4);
    expect(latticeSquares(cells)).toEqual([
      { id: "0/0", col: 0, row: 0, centre: [0.5, 0.5], area: 1.5, value: 6 },
      { id: "2/0", col: 2, row: 0, centre: [2.5, 0.5], area: 0.5, value: 0 },
    ]);
  });
  it("keeps to the spits in scope; a square with no record there is not excavated", () => {
    const cells = squareCells(squares, samples, { classId: "FL", spitIds: ["s2"] });
    expect(cells.map((c) => c.state)).toEqual(["counted", "not-excavated", "not-excavated"]);
    expect(cellValue(cells[0]!, "density")).toBe(4); // 2 flakes in 0.5 m²
  });
  it("counts piece-plotted finds in the same squares, a find on a grid line going east", () => {
    const finds = [
      { x: 0.2, y: 0.5, classId: "FL", contextId: "c1" },
      { x: 1, y: 0.5, classId: "FL", contextId: "c1" },
      { x: 2.2, y: 0.1, classId: "FL", contextId: "c1" },
      { x: 2.2, y: 0.2, classId: "BB", contextId: "c1" },
    ];
    const cells = findCells(squares, grid, finds, { classId: "FL" });
    expect(cells.map((c) => c.count)).toEqual([1, 1, 1]);
    expect(cellValue(cells[2]!, "density")).toBe(2);
  });
});

describe("classes and colours", () => {
  it("uses viridis's own stops at the ends and middle", () => {
    expect(viridis(0)).toBe(VIRIDIS_STOPS[0]);
    expect(viridis(0.5)).toBe("#21918c");
    expect(viridis(1)).toBe("#fde725");
  });
  it("cuts equal intervals between the smallest and largest value above 0", () => {
    const s = classBreaks([0, 2, 4, 6, 10], "equal", 4);
    expect(s.breaks).toEqual([2, 4, 6, 8, 10]);
    expect([2, 4, 4.5, 10, 0].map((v) => classOf(s, v))).toEqual([0, 0, 1, 3, -1]);
    expect(classLabels(s)).toEqual(["2–4", "4–6", "6–8", "8–10"]);
  });
  it("cuts quantiles (R type 7) and merges breaks that coincide", () => {
    // Positive values 1, 1, 1, 2, 9: quartiles by R's quantile(type = 7) are 1, 1, 1, 2, 9.
    const s = classBreaks([1, 1, 1, 2, 9, 0], "quantile", 4);
    expect(s.breaks).toEqual([1, 2, 9]);
    expect(s.colours).toEqual([VIRIDIS_STOPS[0], VIRIDIS_STOPS[6]]);
  });
});
