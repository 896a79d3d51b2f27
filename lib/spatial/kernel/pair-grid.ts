/**
 * All pairs within r_max through a uniform cell grid of side r_max (each point meets only its own and
 * neighbouring cells), written for simulation loops: the returned list and the grid are reused, nothing is
 * allocated per pattern once the buffers have grown. The estimators on observed data use kdbush through
 * neighbours.ts; this is the hot path only.
 */
import { createCellGrid } from "./cell-grid";
import type { PairList } from "../geometry/neighbours";
import { SpatialInputError } from "../errors";
import type { BBox } from "../types";

export type { PairList };

export interface PairScanner {
  /** Pairs (i < j) of one pattern with distance ≤ rmax. The returned object is reused by the next call. */
  within(x: Float64Array, y: Float64Array, n: number): PairList;
  /** Pairs (a of pattern A, b of pattern B) with distance ≤ rmax; i indexes A, j indexes B. */
  between(ax: Float64Array, ay: Float64Array, na: number, bx: Float64Array, by: Float64Array, nb: number): PairList;
}

export function createPairScanner(bbox: BBox, rmax: number): PairScanner {
  if (!(rmax > 0) || !Number.isFinite(rmax))
    throw new SpatialInputError(`r_max must be a positive distance; got ${rmax}.`);
  const grid = createCellGrid(bbox, rmax);
  const { nx, ny, cellStart } = grid;
  const r2 = rmax * rmax;
  const list: PairList = { count: 0, i: new Int32Array(1024), j: new Int32Array(1024), d: new Float64Array(1024) };

  const push = (a: number, b: number, d: number): void => {
    if (list.count === list.i.length) {
      const cap = list.i.length * 2;
      const i = new Int32Array(cap),
        j = new Int32Array(cap),
        dd = new Float64Array(cap);
      i.set(list.i);
      j.set(list.j);
      dd.set(list.d);
      Object.assign(list, { i, j, d: dd });
    }
    list.i[list.count] = a;
    list.j[list.count] = b;
    list.d[list.count] = d;
    list.count++;
  };

  const within = (x: Float64Array, y: Float64Array, n: number): PairList => {
    grid.bucket(x, y, n);
    const { sx, sy, order } = grid;
    list.count = 0;
    for (let cy = 0; cy < ny; cy++) {
      for (let cx = 0; cx < nx; cx++) {
        const s0 = cellStart[cy * nx + cx],
          s1 = cellStart[cy * nx + cx + 1];
        // Half stencil: the rest of this row's cell and the next one, then the three cells of the next row.
        const rowEnd = cellStart[cy * nx + Math.min(nx - 1, cx + 1) + 1];
        const hasNext = cy + 1 < ny;
        const n0 = hasNext ? cellStart[(cy + 1) * nx + Math.max(0, cx - 1)] : 0;
        const n1 = hasNext ? cellStart[(cy + 1) * nx + Math.min(nx - 1, cx + 1) + 1] : 0;
        for (let p = s0; p < s1; p++) {
          const xa = sx[p],
            ya = sy[p],
            a = order[p];
          for (let q = p + 1; q < rowEnd; q++) {
            const dx = sx[q] - xa,
              dy = sy[q] - ya,
              dd = dx * dx + dy * dy;
            if (dd <= r2) push(Math.min(a, order[q]), Math.max(a, order[q]), Math.sqrt(dd));
          }
          for (let q = n0; q < n1; q++) {
            const dx = sx[q] - xa,
              dy = sy[q] - ya,
              dd = dx * dx + dy * dy;
            if (dd <= r2) push(Math.min(a, order[q]), Math.max(a, order[q]), Math.sqrt(dd));
          }
        }
      }
    }
    return list;
  };

  const between = (
    ax: Float64Array,
    ay: Float64Array,
    na: number,
    bx: Float64Array,
    by: Float64Array,
    nb: number,
  ): PairList => {
    grid.bucket(bx, by, nb);
    const { sx, sy, order } = grid;
    list.count = 0;
    for (let a = 0; a < na; a++) {
      const xa = ax[a],
        ya = ay[a];
      const cx = grid.col(xa),
        cy = grid.row(ya);
      for (let oy = Math.max(0, cy - 1); oy <= Math.min(ny - 1, cy + 1); oy++) {
        const q0 = cellStart[oy * nx + Math.max(0, cx - 1)];
        const q1 = cellStart[oy * nx + Math.min(nx - 1, cx + 1) + 1];
        for (let q = q0; q < q1; q++) {
          const dx = sx[q] - xa,
            dy = sy[q] - ya,
            dd = dx * dx + dy * dy;
          if (dd <= r2) push(a, order[q], Math.sqrt(dd));
        }
      }
    }
    return list;
  };

  return { within, between };
}
