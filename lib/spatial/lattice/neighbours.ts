/**
 * Neighbour lists for squares: rook and queen contiguity from grid indices or from the clipped shapes, and
 * distance bands between centres. Every list is symmetric and excludes the unit itself; Gi* adds the unit
 * when the weights are made (weights.ts).
 */
import Flatbush from "flatbush";
import KDBush from "kdbush";
import { SpatialInputError } from "../errors";
import type { Ring } from "../types";
import type { NeighbourList } from "./types";

/** Neighbour sets (one per unit) to compressed rows, sorted. */
export function toNeighbourList(sets: Set<number>[]): NeighbourList {
  const n = sets.length;
  const start = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) start[i + 1] = start[i] + sets[i].size;
  const index = new Int32Array(start[n]);
  for (let i = 0; i < n; i++)
    index.set(
      [...sets[i]].sort((a, b) => a - b),
      start[i],
    );
  return { n, start, index };
}

function link(sets: Set<number>[], i: number, j: number): void {
  sets[i].add(j);
  sets[j].add(i);
}

const ROOK = [
  [1, 0],
  [0, 1],
];
const QUEEN = [
  [1, 0],
  [0, 1],
  [1, 1],
  [1, -1],
];

/**
 * Rook (shared edge) or queen (shared edge or corner) contiguity from the grid's column and row: squares one
 * step apart across, or diagonally for queen. spdep's cell2nb gives the same lists on a full grid.
 */
export function gridContiguity(
  cells: { id: string; col?: number; row?: number }[],
  type: "rook" | "queen",
): NeighbourList {
  const at = new Map<string, number>();
  cells.forEach((c, i) => {
    if (!Number.isSafeInteger(c.col) || !Number.isSafeInteger(c.row)) {
      throw new SpatialInputError(
        `Square ${c.id} has no whole-number column and row on the grid, which ${type} contiguity from the grid needs.`,
      );
    }
    const key = `${c.col},${c.row}`;
    const other = at.get(key);
    if (other !== undefined)
      throw new SpatialInputError(`Squares ${cells[other].id} and ${c.id} have the same column and row (${key}).`);
    at.set(key, i);
  });
  const sets = cells.map(() => new Set<number>());
  const steps = type === "rook" ? ROOK : QUEEN;
  cells.forEach((c, i) => {
    for (const [dc, dr] of steps) {
      const j = at.get(`${c.col! + dc},${c.row! + dr}`);
      if (j !== undefined) link(sets, i, j);
    }
  });
  return toNeighbourList(sets);
}

/**
 * Squares whose centres lie from `lower` to `upper` metres apart, both ends included (spdep's dnearneigh,
 * bounds "GE" and "LE"). The upper end is widened by 1e-9 of itself so that a band of exactly one square's
 * width keeps the squares next door when their centres carry rounding error.
 */
export function distanceBand(
  cells: { id: string; centre?: [number, number] }[],
  upper: number,
  lower = 0,
): NeighbourList {
  if (!(Number.isFinite(upper) && upper > 0))
    throw new SpatialInputError(`The distance band's upper limit must be a positive distance in metres; got ${upper}.`);
  if (!(Number.isFinite(lower) && lower >= 0 && lower < upper))
    throw new SpatialInputError(`The distance band's lower limit must be from 0 up to the upper limit; got ${lower}.`);
  const index = new KDBush(Math.max(cells.length, 1));
  cells.forEach((c) => {
    const p = c.centre;
    if (!Array.isArray(p) || !Number.isFinite(p[0]) || !Number.isFinite(p[1])) {
      throw new SpatialInputError(`Square ${c.id} has no centre [x, y], which a distance band needs.`);
    }
    index.add(p[0], p[1]);
  });
  index.finish();
  const hi = upper * (1 + 1e-9);
  const sets = cells.map(() => new Set<number>());
  cells.forEach((c, i) => {
    const [x, y] = c.centre!;
    for (const j of index.within(x, y, hi)) {
      if (j <= i) continue;
      const d = Math.hypot(cells[j].centre![0] - x, cells[j].centre![1] - y);
      if (d >= lower && d <= hi) link(sets, i, j);
    }
  });
  return toNeighbourList(sets);
}

interface Shape {
  edges: Float64Array; // x1, y1, x2, y2 per edge
}

function shapeOf(id: string, rings: Ring[] | undefined): Shape {
  if (!Array.isArray(rings) || rings.length === 0)
    throw new SpatialInputError(`Square ${id} has no shape (rings), which contiguity from the shapes needs.`);
  const out: number[] = [];
  rings.forEach((ring, r) => {
    if (!Array.isArray(ring) || ring.length < 3)
      throw new SpatialInputError(`Ring ${r + 1} of square ${id} needs at least 3 vertices.`);
    for (let k = 0; k < ring.length; k++) {
      const a = ring[k];
      const b = ring[(k + 1) % ring.length];
      if (![a[0], a[1]].every(Number.isFinite))
        throw new SpatialInputError(
          `Vertex ${k + 1} of ring ${r + 1} of square ${id} is not a pair of finite numbers.`,
        );
      if (a[0] !== b[0] || a[1] !== b[1]) out.push(a[0], a[1], b[0], b[1]);
    }
  });
  return { edges: Float64Array.from(out) };
}

/** Distance from (px, py) to the segment (ax, ay)–(bx, by). */
function pointSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  const t = len2 > 0 ? Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / len2)) : 0;
  return Math.hypot(px - ax - t * dx, py - ay - t * dy);
}

/** Length of the stretch two segments share (0 unless they are collinear within `tol`). */
function sharedLength(e: Float64Array, a: number, f: Float64Array, b: number, tol: number): number {
  const ax = e[a],
    ay = e[a + 1],
    bx = e[a + 2],
    by = e[a + 3];
  const len = Math.hypot(bx - ax, by - ay);
  if (len === 0) return 0;
  const ux = (bx - ax) / len,
    uy = (by - ay) / len;
  const off = (x: number, y: number) => Math.abs((x - ax) * uy - (y - ay) * ux);
  if (off(f[b], f[b + 1]) > tol || off(f[b + 2], f[b + 3]) > tol) return 0;
  const t1 = (f[b] - ax) * ux + (f[b + 1] - ay) * uy;
  const t2 = (f[b + 2] - ax) * ux + (f[b + 3] - ay) * uy;
  return Math.min(len, Math.max(t1, t2)) - Math.max(0, Math.min(t1, t2));
}

function touches(p: Shape, q: Shape, rook: boolean, tol: number): boolean {
  const e = p.edges,
    f = q.edges;
  for (let a = 0; a < e.length; a += 4) {
    for (let b = 0; b < f.length; b += 4) {
      if (sharedLength(e, a, f, b, tol) > tol) return true;
      if (!rook) {
        if (pointSegment(e[a], e[a + 1], f[b], f[b + 1], f[b + 2], f[b + 3]) <= tol) return true;
        if (pointSegment(f[b], f[b + 1], e[a], e[a + 1], e[a + 2], e[a + 3]) <= tol) return true;
      }
    }
  }
  return false;
}

/**
 * Rook or queen contiguity from the clipped squares' boundaries. Rook: the two share a stretch of boundary
 * longer than `tolerance` metres; queen: they share any point (within `tolerance`). Where the outline or a
 * hole cuts between two squares of the grid, they stop being neighbours, which the grid rule cannot see.
 * spdep's poly2nb compares vertices only (queen: one shared vertex, rook: two); on clipped squares the two
 * agree when every shared stretch ends in a vertex of both squares.
 */
export function shapeContiguity(
  cells: { id: string; rings?: Ring[] }[],
  type: "rook" | "queen",
  tolerance = 1e-6,
): NeighbourList {
  const shapes = cells.map((c) => shapeOf(c.id, c.rings));
  const tree = new Flatbush(Math.max(shapes.length, 1));
  const boxes = shapes.map((s) => {
    let minX = Infinity,
      minY = Infinity,
      maxX = -Infinity,
      maxY = -Infinity;
    for (let k = 0; k < s.edges.length; k += 2) {
      minX = Math.min(minX, s.edges[k]);
      maxX = Math.max(maxX, s.edges[k]);
      minY = Math.min(minY, s.edges[k + 1]);
      maxY = Math.max(maxY, s.edges[k + 1]);
    }
    tree.add(minX, minY, maxX, maxY);
    return [minX, minY, maxX, maxY];
  });
  if (shapes.length === 0) tree.add(0, 0, 0, 0);
  tree.finish();
  const sets = cells.map(() => new Set<number>());
  boxes.forEach(([x0, y0, x1, y1], i) => {
    for (const j of tree.search(x0 - tolerance, y0 - tolerance, x1 + tolerance, y1 + tolerance)) {
      if (j > i && j < shapes.length && touches(shapes[i], shapes[j], type === "rook", tolerance)) link(sets, i, j);
    }
  });
  return toNeighbourList(sets);
}
