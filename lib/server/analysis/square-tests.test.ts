/**
 * Edge squares in the run's square-count tests, with answers worked by hand. The trench is 2 m × 2 m of
 * 1 m squares with a notch 0.2 m wide cut down from the north side to y = 1: the two northern squares
 * keep [0, 0.9] × [1, 2] and [1.1, 2] × [1, 2], next to each other on the grid but no longer touching.
 */
import { describe, expect, it } from "vitest";
import { buildLattice } from "@/lib/spatial";
import { clipSquares } from "@/lib/geometry/square-grid";
import { clippedSquareShape } from "@/lib/geometry/square-shape";
import { latticeSquares, squareCells, type SampleLike } from "@/lib/squares/square-values";
import { createWindow } from "@/lib/spatial";
import { squareTestView } from "@/lib/patterns-view/square-view";
import { squareTestSchema } from "@/lib/schemas/run";
import { runSquareTests as runStored } from "./square-tests";
import type { ScopeData } from "./scope-data";

const outer: [number, number][] = [
  [0, 0],
  [2, 0],
  [2, 2],
  [1.1, 2],
  [1.1, 1],
  [0.9, 1],
  [0.9, 2],
  [0, 2],
];
const window = createWindow({ outer });
const grid = { size: 1, originX: 0, originY: 0 };
const squares = clipSquares(window, grid);
const record = (col: number, row: number, count: number, area: number, spitId = "s1"): SampleLike => ({
  col,
  row,
  contextId: "c",
  spitId,
  area,
  outside: false,
  counts: [{ classId: "k", count, weightG: null }],
});

/** The neighbour pairs of a lattice, by square label. */
function pairs(input: ReturnType<typeof latticeSquares>, rule: Parameters<typeof buildLattice>[1]) {
  const l = buildLattice({ squares: input }, { ...rule, isolated: "drop" });
  const out: string[] = [];
  for (let i = 0; i < l.ids.length; i++)
    for (let p = l.neighbours.start[i]!; p < l.neighbours.start[i + 1]!; p++)
      if (l.neighbours.index[p]! > i) out.push(`${l.ids[i]}–${l.ids[l.neighbours.index[p]!]}`);
  return out.sort();
}

describe("edge squares: neighbours and centres from the squares as the trench cuts them", () => {
  const cells = squareCells(
    squares,
    [record(0, 0, 1, 1), record(1, 0, 2, 1), record(0, 1, 3, 0.9), record(1, 1, 4, 0.9)],
    { classId: "k" },
  );
  const units = latticeSquares(cells, (c) => clippedSquareShape(window, c));

  it("rook from the cut shapes drops the pair the notch separates; the grid would keep it", () => {
    expect(pairs(units, { neighbours: { type: "rook", from: "grid" } })).toEqual([
      "0/0–0/1",
      "0/0–1/0",
      "0/1–1/1",
      "1/0–1/1",
    ]);
    expect(pairs(units, { neighbours: { type: "rook", from: "shapes" } })).toEqual(["0/0–0/1", "0/0–1/0", "1/0–1/1"]);
    // Queen: the diagonals no longer meet either (the notch keeps (1, 1) from both northern squares).
    expect(pairs(units, { neighbours: { type: "queen", from: "shapes" } })).toEqual(["0/0–0/1", "0/0–1/0", "1/0–1/1"]);
  });

  it("a distance band measures from the cut squares' centroids", () => {
    expect(units.map((u) => u.centre.map((v) => +v.toFixed(12)))).toEqual([
      [0.5, 0.5],
      [1.5, 0.5],
      [0.45, 1.5],
      [1.55, 1.5],
    ]);
    // 1 m band: only the southern pair is 1 m apart; 0/0 to 0/1 is √(0.05² + 1) ≈ 1.00125 m.
    expect(pairs(units, { neighbours: { type: "distance", upper: 1 } })).toEqual(["0/0–1/0"]);
  });
});

describe("runSquareTests on a cut trench", () => {
  // 4 × 4 squares of 1 m with the same notch at the north edge between columns 1 and 2 (x 1.9–2.1, y ≥ 3).
  const big = createWindow({
    outer: [
      [0, 0],
      [4, 0],
      [4, 4],
      [2.1, 4],
      [2.1, 3],
      [1.9, 3],
      [1.9, 4],
      [0, 4],
    ],
  });
  const scope = (samples: { col: number; row: number; count: number; area: number | null; spit: string }[]) =>
    ({
      trench: {
        code: "T1",
        squareSize: 1,
        squareOriginX: 0,
        squareOriginY: 0,
        outline: { type: "Polygon", coordinates: [[...big.outer, big.outer[0]]] },
      },
      window: big,
      classes: [{ id: "k", code: "FLK" }],
      squareSamples: samples.map((s, i) => ({
        id: `r${i}`,
        col: s.col,
        row: s.row,
        contextId: "c",
        spitId: s.spit,
        excavatedArea: s.area,
        updatedAt: new Date(0),
        counts: [{ classId: "k", count: s.count, weightG: null }],
      })),
    }) as unknown as ScopeData;
  const every = () => {
    const out: { col: number; row: number; count: number; area: number | null; spit: string }[] = [];
    for (let row = 0; row < 4; row++)
      for (let col = 0; col < 4; col++) out.push({ col, row, count: (col * 3 + row * 5) % 7, area: null, spit: "s1" });
    return out;
  };
  const params = { nsim: 0, level: 0.05 };
  const rookBinaryDensity = squareTestSchema.parse({
    type: "moran",
    neighbours: { type: "rook" },
    style: "binary",
    variable: "density",
  });
  /** The tests as the workspace shows them. */
  const runSquareTests = async (...args: Parameters<typeof runStored>) =>
    (await runStored(...args)).map((t) => squareTestView(t, () => "FLK"));

  it("takes neighbours from the cut squares and says so in the result and its cautions", async () => {
    const [t] = await runSquareTests(scope(every()), [rookBinaryDensity], params, 1);
    expect(t!.neighbours).toBe("rook contiguity (a shared edge), from the clipped squares");
    expect(t!.notes.join(" ")).toMatch(/Neighbours from the squares as the outline and holes cut them/);
    expect(t!.notes.join(" ")).toMatch(/Edge squares: tested as density/);
  });

  it("density over the area dug summed over spits: a square dug twice with the same finds per spit is not richer", async () => {
    const one = every();
    const two = [...one, ...one.filter((s) => s.col === 0).map((s) => ({ ...s, spit: "s2" }))];
    const [a] = await runSquareTests(scope(one), [rookBinaryDensity], params, 1);
    const [b] = await runSquareTests(scope(two), [rookBinaryDensity], params, 1);
    // Column 0 dug through two spits with the same counts in each: its density, and so Moran's I, unchanged.
    expect(b!.statistic).toBeCloseTo(a!.statistic!, 12);
    const cell = b!.cells.find((c) => c.label === "0/1")!;
    expect(cell.area).toBe(2);
    expect(cell.value).toBe(5 / 1); // 2 × 5 finds in 2 m² dug
    expect(b!.notes[0]).toMatch(
      /different numbers of spits or contexts in this scope \(1 to 2\): each square's density is its finds over the area dug summed/,
    );
  });
});
