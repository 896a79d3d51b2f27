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
