/**
 * A uniform grid of square cells over a bounding box, filled by counting sort. After `bucket`, the points of
 * cell c are sorted positions cellStart[c] .. cellStart[c+1]-1, with coordinates copied into sx, sy (so that
 * the pair loops read memory in order) and order[p] the original index of sorted position p. Buffers grow
 * only when a pattern is larger than any before; nothing is allocated per pattern.
 */
import type { BBox } from "../types";

export interface CellGrid {
  readonly nx: number;
  readonly ny: number;
  readonly cellSize: number;
  readonly cellStart: Int32Array;
  sx: Float64Array;
  sy: Float64Array;
  order: Int32Array;
  bucket(x: Float64Array, y: Float64Array, n: number): void;
  /** Cell column / row of a coordinate, clamped to the grid. */
  col(x: number): number;
  row(y: number): number;
}

export function createCellGrid(bbox: BBox, cellSize: number): CellGrid {
  const nx = Math.max(1, Math.ceil((bbox.maxX - bbox.minX) / cellSize));
  const ny = Math.max(1, Math.ceil((bbox.maxY - bbox.minY) / cellSize));
  const cells = nx * ny;
  const cellStart = new Int32Array(cells + 1);
  const fillAt = new Int32Array(cells);
  let cellOf = new Int32Array(0);
  const col = (x: number): number => {
    const c = Math.floor((x - bbox.minX) / cellSize);
    return c < 0 ? 0 : c >= nx ? nx - 1 : c;
  };
  const row = (y: number): number => {
    const c = Math.floor((y - bbox.minY) / cellSize);
    return c < 0 ? 0 : c >= ny ? ny - 1 : c;
  };
  const grid: CellGrid = {
    nx,
    ny,
    cellSize,
    cellStart,
    sx: new Float64Array(0),
    sy: new Float64Array(0),
    order: new Int32Array(0),
    col,
    row,
    bucket(x, y, n) {
      if (grid.order.length < n) {
        grid.sx = new Float64Array(n);
        grid.sy = new Float64Array(n);
        grid.order = new Int32Array(n);
        cellOf = new Int32Array(n);
      }
      cellStart.fill(0);
      for (let k = 0; k < n; k++) {
        const c = row(y[k]) * nx + col(x[k]);
        cellOf[k] = c;
        cellStart[c + 1]++;
      }
      for (let c = 0; c < cells; c++) cellStart[c + 1] += cellStart[c];
      fillAt.set(cellStart.subarray(0, cells));
      const { sx, sy, order } = grid;
      for (let k = 0; k < n; k++) {
        const p = fillAt[cellOf[k]]++;
        order[p] = k;
        sx[p] = x[k];
        sy[p] = y[k];
      }
    },
  };
  return grid;
}

/**
 * The half stencil of a grid with `reach` cells per r max, as the pair loops walk it: for every sorted
 * position p, `visit(p, q0, q1)` with each run q0 .. q1 − 1 of positions to pair p with — the rest of p's
 * cell and the next `reach` cells of its row, then each of the next `reach` rows from cx − reach to
 * cx + reach (a contiguous run of sorted positions each) — so that every unordered pair within r max comes
 * once. Returns the sum of what `visit` returns (the pair loops count their pairs with it).
 */
export function sumOverHalfStencil(
  grid: CellGrid,
  reach: number,
  visit: (p: number, q0: number, q1: number) => number,
): number {
  const { nx, ny, cellStart } = grid;
  let total = 0;
  for (let cy = 0; cy < ny; cy++) {
    for (let cx = 0; cx < nx; cx++) {
      const s0 = cellStart[cy * nx + cx],
        s1 = cellStart[cy * nx + cx + 1];
      const rowEnd = cellStart[cy * nx + Math.min(nx - 1, cx + reach) + 1];
      const lo = Math.max(0, cx - reach),
        hi = Math.min(nx - 1, cx + reach);
      for (let p = s0; p < s1; p++) {
        total += visit(p, p + 1, rowEnd);
        for (let row = cy + 1; row <= cy + reach && row < ny; row++)
          total += visit(p, cellStart[row * nx + lo], cellStart[row * nx + hi + 1]);
      }
    }
  }
  return total;
}
