/**
 * Neighbour search, never all n² pairs: a uniform cell grid for the pairs of one pattern (the common case,
 * about three times faster than tree queries that allocate per point), and a static k-d tree (kdbush)
 * for pairs between patterns and nearest neighbours.
 * The simulation loop has its own allocation-free grid scanner (pair-grid.ts) with the same PairList
 * shape, so every estimator here accepts pairs from either source.
 */
import KDBush from "kdbush";
import type { Points } from "../types";
import { SpatialInputError } from "../errors";

/** Unordered pairs as parallel typed arrays; only the first `count` entries are meaningful. */
export interface PairList {
  count: number;
  i: Int32Array;
  j: Int32Array;
  d: Float64Array;
}

function buildIndex(p: Points): KDBush {
  const index = new KDBush(p.x.length, 32);
  for (let k = 0; k < p.x.length; k++) index.add(p.x[k], p.y[k]);
  return index.finish();
}

function assertRadius(rmax: number): void {
  if (!(rmax > 0) || !Number.isFinite(rmax))
    throw new SpatialInputError(`r max must be a positive distance; got ${rmax}.`);
}

class PairBuilder {
  count = 0;
  i = new Int32Array(1024);
  j = new Int32Array(1024);
  d = new Float64Array(1024);
  push(a: number, b: number, dist: number): void {
    if (this.count === this.i.length) {
      const grow = <T extends Int32Array | Float64Array>(old: T, make: (n: number) => T): T => {
        const next = make(old.length * 2);
        next.set(old);
        return next;
      };
      this.i = grow(this.i, (n) => new Int32Array(n));
      this.j = grow(this.j, (n) => new Int32Array(n));
      this.d = grow(this.d, (n) => new Float64Array(n));
    }
    this.i[this.count] = a;
    this.j[this.count] = b;
    this.d[this.count] = dist;
    this.count++;
  }
  result(): PairList {
    return { count: this.count, i: this.i, j: this.j, d: this.d };
  }
}

/**
 * Counting sort of a pattern into square cells of side `cell` over its bounding box: the points of cell c
 * are order[start[c] .. start[c+1]-1].
 */
interface CellSort {
  nx: number;
  ny: number;
  minX: number;
  minY: number;
  start: Int32Array;
  order: Int32Array;
}

function sortIntoCells(p: Points, cell: number): CellSort {
  const n = p.x.length;
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (let k = 0; k < n; k++) {
    minX = Math.min(minX, p.x[k]);
    maxX = Math.max(maxX, p.x[k]);
    minY = Math.min(minY, p.y[k]);
    maxY = Math.max(maxY, p.y[k]);
  }
  // cap the grid at about 4 cells per point so a tiny r max cannot blow up memory
  const side = Math.max(cell, Math.sqrt(((maxX - minX) * (maxY - minY)) / (4 * n + 1)), Number.MIN_VALUE);
  const nx = Math.min(1 << 15, Math.floor((maxX - minX) / side) + 1);
  const ny = Math.min(1 << 15, Math.floor((maxY - minY) / side) + 1);
  const cellOf = new Int32Array(n);
  const start = new Int32Array(nx * ny + 1);
  for (let k = 0; k < n; k++) {
    const cx = Math.min(nx - 1, Math.floor((p.x[k] - minX) / side));
    const cy = Math.min(ny - 1, Math.floor((p.y[k] - minY) / side));
    cellOf[k] = cy * nx + cx;
    start[cellOf[k] + 1]++;
  }
  for (let c = 0; c < nx * ny; c++) start[c + 1] += start[c];
  const fill = start.slice(0, nx * ny);
  const order = new Int32Array(n);
  for (let k = 0; k < n; k++) order[fill[cellOf[k]]++] = k;
  return { nx, ny, minX, minY, start, order };
}

/**
 * Every unordered pair i < j of one pattern with d_ij ≤ rmax, enumerated once. A uniform grid of cells of
 * side ≥ rmax: each point meets only the points of its own and the eight surrounding cells.
 */
export function pairsWithin(p: Points, rmax: number): PairList {
  assertRadius(rmax);
  const grid = sortIntoCells(p, rmax);
  const { nx, ny, start, order } = grid;
  const r2 = rmax * rmax;
  const out = new PairBuilder();
  const { x, y } = p;
  for (let cy = 0; cy < ny; cy++) {
    for (let cx = 0; cx < nx; cx++) {
      const c = cy * nx + cx;
      for (let s = start[c]; s < start[c + 1]; s++) {
        const a = order[s];
        const xa = x[a],
          ya = y[a];
        // own cell (later entries only), then the forward half of the neighbours: E, NW, N, NE
        for (let t = s + 1; t < start[c + 1]; t++) {
          const b = order[t];
          const dx = x[b] - xa,
            dy = y[b] - ya,
            d2 = dx * dx + dy * dy;
          if (d2 <= r2) out.push(a < b ? a : b, a < b ? b : a, Math.sqrt(d2));
        }
        for (let q = 0; q < 4; q++) {
          const ox = q === 0 ? cx + 1 : cx + q - 2;
          const oy = q === 0 ? cy : cy + 1;
          if (ox < 0 || ox >= nx || oy >= ny) continue;
          const o = oy * nx + ox;
          for (let t = start[o]; t < start[o + 1]; t++) {
            const b = order[t];
            const dx = x[b] - xa,
              dy = y[b] - ya,
              d2 = dx * dx + dy * dy;
            if (d2 <= r2) out.push(a < b ? a : b, a < b ? b : a, Math.sqrt(d2));
          }
        }
      }
    }
  }
  return out.result();
}

/** Every pair (a in A, b in B) with d ≤ rmax; i indexes A, j indexes B. Found through kdbush. */
export function pairsBetween(a: Points, b: Points, rmax: number): PairList {
  assertRadius(rmax);
  const index = buildIndex(b);
  const out = new PairBuilder();
  for (let s = 0; s < a.x.length; s++) {
    const xs = a.x[s];
    const ys = a.y[s];
    for (const t of index.within(xs, ys, rmax)) {
      const dx = b.x[t] - xs;
      const dy = b.y[t] - ys;
      out.push(s, t, Math.sqrt(dx * dx + dy * dy));
    }
  }
  return out.result();
}

/**
 * Distance from each point to its nearest other point (or, with `to`, to the nearest point of `to`).
 * The search radius doubles from a guess at the typical spacing, so clustered and sparse patterns both stay
 * fast.
 */
export function nearestNeighbourDistances(p: Points, to?: Points): Float64Array {
  const target = to ?? p;
  if (target.x.length < (to ? 1 : 2))
    throw new SpatialInputError("Nearest-neighbour distances need at least 2 points.");
  const index = buildIndex(target);
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (const q of [p, target]) {
    for (let k = 0; k < q.x.length; k++) {
      minX = Math.min(minX, q.x[k]);
      maxX = Math.max(maxX, q.x[k]);
      minY = Math.min(minY, q.y[k]);
      maxY = Math.max(maxY, q.y[k]);
    }
  }
  // Every distance is at most the diagonal of the joint bounding box.
  const span = Math.hypot(maxX - minX, maxY - minY);
  const start = span > 0 ? span / Math.sqrt(target.x.length) : 1;
  const out = new Float64Array(p.x.length);
  for (let a = 0; a < p.x.length; a++) {
    const xa = p.x[a];
    const ya = p.y[a];
    let best = Infinity;
    for (let radius = start; ; radius *= 2) {
      for (const b of index.within(xa, ya, radius)) {
        if (!to && b === a) continue;
        const dist = Math.hypot(target.x[b] - xa, target.y[b] - ya);
        if (dist < best) best = dist;
      }
      // A point found within the searched radius is the true nearest; past the diagonal nothing is left.
      if (best <= radius || radius >= span) break;
    }
    out[a] = best;
  }
  return out;
}
