import "server-only";
import {
  parseSquareTestSpec,
  runSquareTestAsync,
  SpatialInputError,
  type LatticeSquare,
  type SquareTestSpec,
} from "@/lib/spatial";
import { clippedSquareShape, type SquareShape } from "@/lib/geometry/square-shape";
import { latticeSquares, squareCells, type SampleLike, type SquareCell } from "@/lib/squares/square-values";
import { gridOf, trenchSquares } from "../squares";
import type { SquareUnit, StoredSquareTest } from "@/lib/api/run-result";
import type { SquareTest } from "@/lib/schemas/run";
import type { ScopeData } from "./scope-data";

/**
 * The square-count tests of a run (issue 16), on the records loadScope read. For each test and each class
 * in scope, a square is a unit when it has a square record in one of the chosen contexts that counted the
 * class (a record that did not count it says nothing of it: not counted is not zero). Its value is the
 * class's count summed over those records and its area the areas they dug, summed (squareCells: density is
 * finds per m² dug, alike for squares dug through one spit or several, whole or cut by the outline).
 * Neighbours by rook or queen come from the squares as the outline and holes cut them, and a distance band
 * measures between the cut squares' centroids (lib/geometry/square-shape.ts). Squares without a record are
 * not excavated and are not units; records in squares the redrawn outline no longer holds are left out.
 * The run's permutations and level serve every test; test k of the run uses seed + k.
 */

/**
 * The engine's spec for one asked-for square-count test: as asked, a distance band with no upper limit
 * reaching 1.5 squares of the trench's grid, with the run's permutations, seed and level.
 */
export function squareTestSpec(
  t: SquareTest,
  gridSize: number,
  run: { permutations: number; seed: number; level: number },
): SquareTestSpec {
  const n = t.neighbours;
  return parseSquareTestSpec({
    ...t,
    neighbours: n.type === "distance" ? { ...n, upper: n.upper ?? 1.5 * gridSize } : n,
    ...run,
  });
}

/** Why the square tests cannot run in this scope (no grid, no records). */
export function squareRefusals(data: ScopeData, tests: SquareTest[]): string[] {
  if (!tests.length) return [];
  if (!gridOf(data.trench))
    return [
      `Trench ${data.trench.code} has no square grid: a director sets its square size and origin before counts by square can be tested.`,
    ];
  if (!data.squareSamples.length) return ["No counts by grid square are recorded in the chosen contexts."];
  // A grid that leaves no square to test: every recorded square outside the outline as drawn now, or every
  // one below a test's minimum area. Said before the run is stored, not found out when it runs.
  const grid = gridOf(data.trench)!;
  const bySquare = new Map(trenchSquares(data.trench, grid).map((s) => [`${s.col},${s.row}`, s]));
  const dug = new Map<string, number>();
  for (const s of data.squareSamples) {
    const sq = bySquare.get(`${s.col},${s.row}`);
    if (sq)
      dug.set(`${s.col},${s.row}`, (dug.get(`${s.col},${s.row}`) ?? 0) + Math.min(s.excavatedArea ?? sq.area, sq.area));
  }
  if (!dug.size)
    return [
      `The grid leaves no square to test: every square counted in the chosen contexts lies outside trench ${data.trench.code}'s outline as drawn now.`,
    ];
  const largest = Math.max(...dug.values());
  const out: string[] = [];
  for (const t of tests)
    if (t.minArea > largest)
      out.push(
        `A minimum area of ${t.minArea} m² leaves no square to test: the most any square in scope was dug is ${+largest.toFixed(4)} m².`,
      );
  return [...new Set(out)];
}

/** How many square-count tests a run holds: one per test and class in scope (for the run's progress). */
export const squareTestCount = (data: ScopeData, tests: SquareTest[]): number => tests.length * data.classes.length;

export interface SquareTestsProgress {
  /** Hears the fraction of the run's square-count tests done, 0..1, as their permutations go. */
  onProgress?: (fraction: number) => void;
  /** Stops at the next step of the permutations (an AbortError). */
  signal?: AbortSignal;
}

export async function runSquareTests(
  data: ScopeData,
  tests: SquareTest[],
  params: { nsim: number; level: number },
  seed: number,
  options: SquareTestsProgress = {},
): Promise<StoredSquareTest[]> {
  if (!tests.length) return [];
  const total = squareTestCount(data, tests);
  const grid = gridOf(data.trench);
  if (!grid) throw new SpatialInputError(squareRefusals(data, tests)[0]!);
  const gridSquares = trenchSquares(data.trench, grid);
  const bySquare = new Map(gridSquares.map((s) => [`${s.col},${s.row}`, s]));
  // Records in squares the redrawn outline no longer holds are left out; a record's area is at most its square's.
  const samples: SampleLike[] = data.squareSamples.flatMap((s) => {
    const sq = bySquare.get(`${s.col},${s.row}`);
    if (!sq) return [];
    const area = Math.min(s.excavatedArea ?? sq.area, sq.area);
    return [
      {
        col: s.col,
        row: s.row,
        contextId: s.contextId,
        spitId: s.spitId,
        area,
        outside: false,
        counts: s.counts,
      },
    ];
  });
  // Each square cut once, for all tests and classes: contiguity from the clipped shapes, bands from their centroids.
  const shapes = new Map<string, SquareShape>();
  const shapeOf = (c: SquareCell) => {
    const key = `${c.col},${c.row}`;
    return shapes.get(key) ?? shapes.set(key, clippedSquareShape(data.window, c)).get(key)!;
  };
  const out: StoredSquareTest[] = [];
  let k = 0;
  for (const t of tests) {
    for (const cls of data.classes) {
      if (options.signal?.aborted) return out;
      const done = k;
      const testSeed = (seed + k++) >>> 0;
      // One unit per square with a record in scope that counted the class: counts and areas dug summed.
      const cells = squareCells(gridSquares, samples, { classId: cls.id });
      const squares: LatticeSquare[] = latticeSquares(cells, shapeOf);
      const byLabel = new Map(cells.map((c) => [c.label, c]));
      const records = new Map<string, number>();
      for (const s of samples)
        if (s.counts.some((n) => n.classId === cls.id))
          records.set(`${s.col},${s.row}`, (records.get(`${s.col},${s.row}`) ?? 0) + 1);
      const depth = [...records.values()];
      const uneven =
        Math.min(...depth) !== Math.max(...depth)
          ? [
              t.variable === "density"
                ? `Squares were dug through different numbers of spits or contexts in this scope (${Math.min(...depth)} to ${Math.max(...depth)}): each square's density is its finds over the area dug summed over them, so depth alone does not make a square richer; spits of unequal thickness still differ.`
                : `Squares were dug through different numbers of spits or contexts in this scope (${Math.min(...depth)} to ${Math.max(...depth)}): the counts are summed per square, so a square dug deeper holds more finds whatever their spread. Test the density, or contexts dug evenly.`,
            ]
          : [];
      const spec = squareTestSpec(t, grid.size, { permutations: params.nsim, seed: testSeed, level: params.level });
      try {
        const result = await runSquareTestAsync({ squares }, spec, {
          signal: options.signal,
          onProgress: (f) => options.onProgress?.((done + f) / total),
        });
        // Each square handed to the engine came from a cell: placed on the plan by its whole grid square.
        const units = squares.flatMap((q): SquareUnit[] => {
          const c = byLabel.get(q.id);
          return c ? [{ label: q.id, x0: c.x0, y0: c.y0, x1: c.x1, y1: c.y1, area: q.area, count: q.value }] : [];
        });
        out.push({ classId: cls.id, gridSize: grid.size, units, result, cautions: uneven });
      } catch (err) {
        if (!(err instanceof SpatialInputError)) throw err;
        // This class cannot be tested here (too few squares, all alike): said on the result, the run goes on.
        out.push({ classId: cls.id, gridSize: grid.size, spec, n: squares.length, refused: err.message });
      }
      options.onProgress?.(k / total);
    }
  }
  return out;
}
