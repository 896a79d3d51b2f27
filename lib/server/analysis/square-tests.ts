import "server-only";
import { runSquareTestAsync, SpatialInputError, type LatticeSquare, type SquareTestResult } from "@/lib/spatial";
import { clippedSquareShape, type SquareShape } from "@/lib/geometry/square-shape";
import { latticeSquares, squareCells, type SampleLike, type SquareCell } from "@/lib/squares/square-values";
import { gridOf, trenchSquares } from "../squares";
import type { SquareCellOut, SquareTestOut, SquareVerdictWord } from "@/lib/api/run-result";
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

export const SQUARE_QUESTIONS: Record<SquareTest["kind"], string> = {
  moran:
    "Do squares with similar counts lie next to each other more than if the counts were placed over the dug squares at random (Moran's I)?",
  geary:
    "Do neighbouring squares differ less (or more) in their counts than if the counts were placed at random (Geary's C, which weighs differences between neighbours)?",
  "local-moran":
    "Which squares sit among neighbours like themselves (high among high, low among low), or stand out from them, more than chance placement allows (local Moran's I)?",
  "getis-ord":
    "Where are the hot and cold spots: squares whose neighbourhood, the square included, holds more or fewer finds than chance placement allows (Getis–Ord Gi*)?",
};

const VERDICT: Record<SquareTestResult["verdict"], SquareVerdictWord> = {
  clustered: "clustered",
  dispersed: "dispersed",
  "hot or cold spots": "hot-spots",
  "no evidence against the null": "no-evidence",
};

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
): Promise<SquareTestOut[]> {
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
  const out: SquareTestOut[] = [];
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
      const spec = {
        type: t.kind,
        neighbours:
          t.neighbours === "distance"
            ? { type: "distance", upper: t.band ?? 1.5 * grid.size }
            : { type: t.neighbours, from: "shapes" },
        style: t.style,
        variable: t.variable,
        minArea: t.minArea,
        isolated: "drop",
        permutations: params.nsim,
        seed: testSeed,
        level: params.level,
      };
      const base = {
        kind: t.kind,
        classId: cls.id,
        question: SQUARE_QUESTIONS[t.kind],
        style: t.style,
        variable: t.variable,
        permutations: params.nsim,
        seed: testSeed,
        gridSize: grid.size,
      };
      const cellOf = (label: string, value: number, extra: Partial<SquareCellOut> = {}): SquareCellOut => {
        const c = byLabel.get(label)!;
        return {
          label,
          x0: c.x0,
          y0: c.y0,
          x1: c.x1,
          y1: c.y1,
          area: c.excavated,
          value,
          statistic: null,
          p: null,
          pAdjusted: null,
          class: "none",
          ...extra,
        };
      };
      try {
        const r = await runSquareTestAsync({ squares }, spec, {
          signal: options.signal,
          onProgress: (f) => options.onProgress?.((done + f) / total),
        });
        const cells = r.squares
          ? r.squares.map((q) =>
              cellOf(q.id, q.value, { statistic: q.statistic, p: q.p, pAdjusted: q.pAdjusted, class: q.class }),
            )
          : squares
              .filter((q) => !r.leftOut.some((l) => l.id === q.id))
              .map((q) => cellOf(q.id, t.variable === "density" ? q.value / q.area : q.value));
        out.push({
          ...base,
          verdict: VERDICT[r.verdict],
          sentence: `${r.summary} Null: ${r.nullName}; seed ${testSeed}.`,
          p: r.p,
          pFrom: r.pFrom,
          notes: [...uneven, ...r.cautions],
          n: r.n,
          leftOut: r.leftOut.map((l) => ({ label: l.id, reason: l.reason })),
          neighbours: r.neighbours,
          statistic: r.global?.statistic ?? null,
          expected: r.global?.expected ?? null,
          z: r.global?.z.randomisation ?? null,
          cells,
        });
      } catch (err) {
        if (!(err instanceof SpatialInputError)) throw err;
        // This class cannot be tested here (too few squares, all alike): said on the result, the run goes on.
        out.push({
          ...base,
          verdict: "not-run",
          sentence: `Not run for ${cls.code}: ${err.message}`,
          p: null,
          pFrom: null,
          notes: [err.message],
          n: squares.length,
          leftOut: [],
          neighbours: "",
          statistic: null,
          expected: null,
          z: null,
          cells: [],
        });
      }
      options.onProgress?.(k / total);
    }
  }
  return out;
}
