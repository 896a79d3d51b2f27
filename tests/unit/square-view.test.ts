/**
 * The workspace's view of a stored square-count test: the engine's result and the squares it was handed,
 * turned into verdict words, the sentence to quote, the question and each square on the plan. The results
 * below are the engine's own (runSquareTest on four squares), so the view is checked against what a run
 * stores, not against a shape written for the test.
 */
import { describe, expect, it } from "vitest";
import { runSquareTest, type LatticeSquare } from "@/lib/spatial";
import type { ClassInScope, SquareUnit, StoredSquareTest } from "@/lib/api/run-result";
import {
  SQUARE_QUESTIONS,
  squareSentenceOf,
  squareTestView,
  squareTestViews,
  squareVerdictWord,
} from "@/lib/patterns-view/square-view";

/** A 3 × 2 grid of 1 m squares; 2/1 was half dug, 0/1 barely (0.1 m²). Counts high in the east. */
const units: SquareUnit[] = [
  [0, 0, 1, 1],
  [1, 0, 2, 1],
  [2, 0, 9, 1],
  [0, 1, 1, 0.1],
  [1, 1, 3, 1],
  [2, 1, 4, 0.5],
].map(([col, row, count, area]) => ({
  label: `${col}/${row}`,
  x0: col!,
  y0: row!,
  x1: col! + 1,
  y1: row! + 1,
  area: area!,
  count: count!,
}));
const squares: LatticeSquare[] = units.map((u) => ({
  id: u.label,
  col: u.x0,
  row: u.y0,
  area: u.area,
  value: u.count,
}));
const FLK: ClassInScope = { id: "k1", code: "FLK", label: "Flint flake", colour: "#000", symbol: "dot", n: 0 };

describe("a stored square-count test as the workspace shows it", () => {
  it("a global test: the squares tested with their density, those below the minimum area left out", () => {
    const result = runSquareTest({ squares }, { type: "moran", neighbours: { type: "queen" }, minArea: 0.2, seed: 4 });
    const stored: StoredSquareTest = { classId: FLK.id, gridSize: 1, units, result, cautions: ["Dug unevenly."] };
    const v = squareTestView(stored, () => "FLK");
    expect(v.kind).toBe("moran");
    expect(v.question).toBe(SQUARE_QUESTIONS.moran);
    expect(v.sentence).toBe(`${result.summary} Null: ${result.nullName}; seed 4.`);
    expect(v.verdict).toBe(squareVerdictWord(result.verdict));
    // The run's caution first, then the engine's.
    expect(v.notes).toEqual(["Dug unevenly.", ...result.cautions]);
    expect(v.leftOut).toEqual([{ label: "0/1", reason: "below the minimum area" }]);
    expect(v.cells.map((c) => [c.label, c.value])).toEqual([
      ["0/0", 1],
      ["1/0", 2],
      ["2/0", 9],
      ["1/1", 3],
      ["2/1", 8], // 4 finds in 0.5 m² dug
    ]);
    expect(v.cells.every((c) => c.class === "none" && c.statistic === null && c.p === null)).toBe(true);
    expect(v.statistic).toBe(result.global!.statistic);
    expect(v.z).toBe(result.global!.z.randomisation);
    expect([v.n, v.style, v.variable, v.permutations, v.seed, v.gridSize]).toEqual([5, "row", "density", 999, 4, 1]);
  });

  it("a local test: each square's statistic, p-values and class words from the engine's rows, placed by its unit", () => {
    const result = runSquareTest(
      { squares },
      { type: "getis-ord", neighbours: { type: "rook" }, variable: "count", permutations: 0, seed: 9 },
    );
    const v = squareTestView({ classId: FLK.id, gridSize: 1, units, result, cautions: [] }, () => "FLK");
    expect(v.cells).toHaveLength(6);
    const row = result.squares!.find((q) => q.id === "2/1")!;
    expect(v.cells.find((c) => c.label === "2/1")).toEqual({
      label: "2/1",
      x0: 2,
      y0: 1,
      x1: 3,
      y1: 2,
      area: 0.5,
      value: 4, // the count, as tested
      statistic: row.statistic,
      p: row.p,
      pAdjusted: row.pAdjusted,
      class: row.class,
    });
    expect(v.pFrom).toBe("normal");
  });

  it("a class the engine refused: not run, said with its message and the class's code", () => {
    const result = runSquareTest({ squares }, { type: "geary", seed: 2 });
    const stored: StoredSquareTest = { classId: FLK.id, gridSize: 2, spec: result.spec, n: 1, refused: "Too few." };
    const [v] = squareTestViews({ classes: [FLK], squareTests: [stored] });
    expect(v).toMatchObject({
      kind: "geary",
      verdict: "not-run",
      sentence: "Not run for FLK: Too few.",
      notes: ["Too few."],
      n: 1,
      p: null,
      cells: [],
      seed: 2,
      gridSize: 2,
    });
    expect(squareTestViews({ classes: [FLK] })).toEqual([]);
  });

  it("a number the stored JSON lost (a NaN kept as null) shows as none, not as NaN", () => {
    const result = runSquareTest({ squares }, { type: "moran", seed: 1 });
    const lost = { ...result, global: { ...result.global!, z: { ...result.global!.z, randomisation: null } } };
    const v = squareTestView({ classId: "k1", gridSize: 1, units, result: lost as never, cautions: [] }, () => "FLK");
    expect(v.z).toBeNull();
    expect(squareSentenceOf(result)).toMatch(/; seed 1\.$/);
  });

  it("verdict words for each of the engine's verdicts", () => {
    expect(
      (["clustered", "dispersed", "hot or cold spots", "no evidence against the null"] as const).map(squareVerdictWord),
    ).toEqual(["clustered", "dispersed", "hot-spots", "no-evidence"]);
  });
});
