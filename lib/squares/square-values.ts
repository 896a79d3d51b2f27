import { squareAt, squareIndex, type GridSquare, type SquareGridSpec } from "@/lib/geometry/square-grid";

/**
 * What one class looks like by square: for each square of the grid its state, count and excavated area,
 * from the square records (or from piece-plotted finds, for comparison). Pure: the map, the trench record
 * and the square-count tests all read it.
 */
export type SampleLike = {
  col: number;
  row: number;
  contextId: string;
  spitId: string | null;
  /** m² dug in this record (0 when the square now lies outside the trench). */
  area: number;
  outside: boolean;
  counts: { classId: string; count: number; weightG: number | null }[];
};

/**
 * counted: a count was entered (0 included); not-counted: the square was dug in scope but this class was
 * not counted there; not-excavated: no record in scope. Only counted squares are units of a test.
 */
export type CellState = "counted" | "not-counted" | "not-excavated";

export type SquareCell = GridSquare & {
  state: CellState;
  count: number | null;
  weightG: number | null;
  excavated: number;
};

export type Measure = "count" | "density";

export const measureWords: Record<Measure, string> = { count: "count per square", density: "count per excavated m²" };

export type CellScope = { classId: string; contextIds?: readonly string[] | null; spitIds?: readonly string[] | null };

/**
 * One cell per square. A square's count sums the records in scope that counted the class, and its
 * excavated area sums the areas those same records dug: each record's count came from its own area, so a
 * square dug through two spits has twice the area dug behind its finds. Density (count / excavated area)
 * is then finds per m² dug, alike for a square dug through one spit or three, and for an edge square cut
 * by the outline or a spit that covers only part of a square. Taking the plan area once instead would
 * make a square look richer for being dug deeper.
 */
export function squareCells(
  squares: readonly GridSquare[],
  samples: readonly SampleLike[],
  scope: CellScope,
): SquareCell[] {
  const ctx = scope.contextIds ? new Set(scope.contextIds) : null;
  const spit = scope.spitIds ? new Set(scope.spitIds) : null;
  const by = new Map<string, SampleLike[]>();
  for (const s of samples) {
    if (s.outside || (ctx && !ctx.has(s.contextId)) || (spit && !(s.spitId && spit.has(s.spitId)))) continue;
    const key = `${s.col},${s.row}`;
    (by.get(key) ?? by.set(key, []).get(key)!).push(s);
  }
  return squares.map((sq) => {
    const inScope = by.get(`${sq.col},${sq.row}`) ?? [];
    if (!inScope.length) return { ...sq, state: "not-excavated" as const, count: null, weightG: null, excavated: 0 };
    let count: number | null = null;
    let weightG: number | null = null;
    let excavated = 0;
    for (const s of inScope) {
      const c = s.counts.find((k) => k.classId === scope.classId);
      if (!c) continue;
      count = (count ?? 0) + c.count;
      if (c.weightG !== null) weightG = (weightG ?? 0) + c.weightG;
      excavated += s.area;
    }
    if (count === null)
      return {
        ...sq,
        state: "not-counted" as const,
        count: null,
        weightG: null,
        excavated: inScope.reduce((sum, s) => sum + s.area, 0),
      };
    return { ...sq, state: "counted" as const, count, weightG, excavated };
  });
}

/**
 * Piece-plotted finds of one class counted in the same squares, for comparison: every square is taken as
 * dug over its whole area inside the trench (finds are recorded wherever they lie).
 */
export function findCells(
  squares: readonly GridSquare[],
  grid: SquareGridSpec,
  finds: readonly { x: number; y: number; classId: string; contextId: string }[],
  scope: CellScope,
): SquareCell[] {
  const ctx = scope.contextIds ? new Set(scope.contextIds) : null;
  const index = squareIndex(squares);
  const counts = new Map<string, number>();
  for (const f of finds) {
    if (f.classId !== scope.classId || (ctx && !ctx.has(f.contextId))) continue;
    const { col, row } = squareAt(grid, f.x, f.y);
    const key = `${col},${row}`;
    if (index.has(key)) counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  return squares.map((sq) => ({
    ...sq,
    state: "counted" as const,
    count: counts.get(`${sq.col},${sq.row}`) ?? 0,
    weightG: null,
    excavated: sq.area,
  }));
}

/** The value mapped: the count, or count per excavated m²; null where nothing was counted. */
export function cellValue(cell: SquareCell, measure: Measure): number | null {
  if (cell.state !== "counted" || cell.count === null) return null;
  if (measure === "count") return cell.count;
  return cell.excavated > 0 ? cell.count / cell.excavated : null;
}

/**
 * The counted squares as the square-count tests take them (lib/spatial/lattice LatticeSquare): area is
 * the excavated area (the test's density is count / that area). With `shapeOf`, each square carries its
 * shape as the trench cuts it (lib/geometry/square-shape.ts): its rings, for contiguity from the clipped
 * shapes, and its centroid as the centre a distance band measures from; without it, the grid square's
 * centre.
 */
export function latticeSquares(
  cells: readonly SquareCell[],
  shapeOf?: (cell: SquareCell) => { rings: [number, number][][]; centroid: [number, number] },
) {
  return cells
    .filter((c) => c.state === "counted" && c.count !== null)
    .map((c) => {
      const shape = shapeOf?.(c);
      return {
        id: c.label,
        col: c.col,
        row: c.row,
        centre: shape?.centroid ?? ([(c.x0 + c.x1) / 2, (c.y0 + c.y1) / 2] as [number, number]),
        ...(shape ? { rings: shape.rings } : {}),
        area: c.excavated,
        value: c.count!,
      };
    });
}
