import { clippedRingArea } from "@/lib/spatial/geometry/ring";
import type { Window } from "@/lib/spatial/types";

/**
 * A trench's square grid for bulk finds counted by square (issue 16): squares of `size` metres whose
 * lines pass through (originX, originY) on the site grid. Square (col, row) has its south-west corner at
 * (originX + col·size, originY + row·size). Squares are named, as on site, by the easting and northing of
 * that corner ("102.5/201").
 */
export type SquareGridSpec = { size: number; originX: number; originY: number };

export type GridSquare = {
  col: number;
  row: number;
  label: string;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  /** |square ∩ trench|, holes taken out (m²). */
  area: number;
  /** True when the square lies wholly inside the trench. */
  whole: boolean;
};

/** Beyond this many squares in the trench's bounding box a grid is refused (a typo such as 0.01 m). */
export const MAX_GRID_SQUARES = 20_000;
/** A square whose clipped area is below this fraction of a full square is a rounding sliver, not a square. */
const SLIVER = 1e-9;

export class SquareGridError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "SquareGridError";
  }
}

/** A coordinate as a label shows it: at most 3 decimals, no trailing zeros. */
export function formatCoordinate(v: number): string {
  return String(+v.toFixed(3) + 0);
}

export function squareCorner(spec: SquareGridSpec, col: number, row: number): [number, number] {
  return [spec.originX + col * spec.size, spec.originY + row * spec.size];
}

export function squareLabel(spec: SquareGridSpec, col: number, row: number): string {
  const [x, y] = squareCorner(spec, col, row);
  return `${formatCoordinate(x)}/${formatCoordinate(y)}`;
}

/** The square holding (x, y); a point on a grid line belongs to the square north or east of it. */
export function squareAt(spec: SquareGridSpec, x: number, y: number): { col: number; row: number } {
  const snap = (v: number) => Math.floor(v + 1e-9);
  return { col: snap((x - spec.originX) / spec.size), row: snap((y - spec.originY) / spec.size) };
}

/**
 * Reads a square's name, "easting/northing" of its south-west corner (a comma or space also separates
 * them); null when it is not two numbers or the corner is not on a grid line.
 */
export function parseSquareLabel(spec: SquareGridSpec, label: string): { col: number; row: number } | null {
  const m = label.trim().match(/^(-?\d+(?:\.\d+)?)\s*[/,\s]\s*(-?\d+(?:\.\d+)?)$/);
  if (!m) return null;
  const fx = (Number(m[1]) - spec.originX) / spec.size;
  const fy = (Number(m[2]) - spec.originY) / spec.size;
  const col = Math.round(fx);
  const row = Math.round(fy);
  if (Math.abs(fx - col) > 1e-6 || Math.abs(fy - row) > 1e-6) return null;
  return { col, row };
}

/** Checks a grid's numbers, throwing a SquareGridError naming what is wrong. */
export function checkGridSpec(spec: SquareGridSpec): void {
  if (!(Number.isFinite(spec.size) && spec.size > 0))
    throw new SquareGridError("The square size must be a positive number of metres.");
  if (!Number.isFinite(spec.originX) || !Number.isFinite(spec.originY))
    throw new SquareGridError("The grid origin must be two finite coordinates.");
}

/**
 * The grid's squares clipped to the trench outline and its holes, with their areas: the outer ring's
 * clipped area less each hole's (Sutherland–Hodgman clipping of each ring against the square, the
 * engine's own `clippedRingArea`, exact for concave rings). Squares with no area inside are left out;
 * ordered by row from the south, then by column from the west.
 */
export function clipSquares(window: Window, spec: SquareGridSpec): GridSquare[] {
  checkGridSpec(spec);
  const { bbox } = window;
  const c0 = Math.floor((bbox.minX - spec.originX) / spec.size);
  const c1 = Math.ceil((bbox.maxX - spec.originX) / spec.size) - 1;
  const r0 = Math.floor((bbox.minY - spec.originY) / spec.size);
  const r1 = Math.ceil((bbox.maxY - spec.originY) / spec.size) - 1;
  const total = (c1 - c0 + 1) * (r1 - r0 + 1);
  if (total > MAX_GRID_SQUARES) {
    throw new SquareGridError(
      `Squares of ${formatCoordinate(spec.size)} m would cut this trench into ${total.toLocaleString("en-GB")} squares; at most ${MAX_GRID_SQUARES.toLocaleString("en-GB")} are kept. Choose larger squares.`,
    );
  }
  const rings = [window.outer, ...window.holes];
  const full = spec.size * spec.size;
  const out: GridSquare[] = [];
  for (let row = r0; row <= r1; row++) {
    for (let col = c0; col <= c1; col++) {
      const [x0, y0] = squareCorner(spec, col, row);
      const [x1, y1] = [x0 + spec.size, y0 + spec.size];
      // Outer ring counter-clockwise (positive), holes clockwise (negative): the sum is the area inside.
      let area = 0;
      for (const ring of rings) area += clippedRingArea(ring as [number, number][], x0, y0, x1, y1);
      if (!(area > SLIVER * full)) continue;
      out.push({
        col,
        row,
        label: squareLabel(spec, col, row),
        x0,
        y0,
        x1,
        y1,
        area,
        whole: Math.abs(area - full) <= 1e-9 * full,
      });
    }
  }
  if (!out.length) throw new SquareGridError("This grid leaves no square inside the trench.");
  return out;
}

/** A lookup "col,row" → square. */
export function squareIndex(squares: readonly GridSquare[]): Map<string, GridSquare> {
  return new Map(squares.map((s) => [`${s.col},${s.row}`, s]));
}
