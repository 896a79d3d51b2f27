/** Plane geometry of single rings: cleaning, signed area (shoelace), segment crossing, clipping. */
import Flatbush from "flatbush";
import { SpatialInputError } from "../errors";
import type { Ring } from "../types";

/**
 * Copy a ring, checking every coordinate is a finite number and dropping a repeated closing vertex and
 * consecutive duplicates. `label` names the ring in error messages ("outer ring", "hole 2").
 */
export function cleanRing(ring: Ring, label: string): Ring {
  if (!Array.isArray(ring)) throw new SpatialInputError(`The ${label} is not a list of [x, y] vertices.`);
  const out: Ring = [];
  ring.forEach((v, k) => {
    if (!Array.isArray(v) || v.length < 2 || !Number.isFinite(v[0]) || !Number.isFinite(v[1])) {
      throw new SpatialInputError(`Vertex ${k + 1} of the ${label} is not a pair of finite numbers.`);
    }
    const last = out[out.length - 1];
    if (!last || last[0] !== v[0] || last[1] !== v[1]) out.push([v[0], v[1]]);
  });
  while (out.length > 1 && out[0][0] === out[out.length - 1][0] && out[0][1] === out[out.length - 1][1]) out.pop();
  if (out.length < 3) {
    throw new SpatialInputError(`The ${label} needs at least 3 distinct vertices; it has ${out.length}.`);
  }
  return out;
}

/**
 * Signed area by the shoelace formula: positive for counter-clockwise rings. Taken relative to the first
 * vertex, so that national-grid coordinates (hundreds of kilometres) lose no precision to cancellation.
 */
export function signedArea(ring: Ring): number {
  const [ox, oy] = ring[0];
  let s = 0;
  for (let k = 0, m = ring.length; k < m; k++) {
    const a = ring[k];
    const b = ring[(k + 1) % m];
    s += (a[0] - ox) * (b[1] - oy) - (b[0] - ox) * (a[1] - oy);
  }
  return s / 2;
}

export function ringLength(ring: Ring): number {
  let s = 0;
  for (let k = 0, m = ring.length; k < m; k++) {
    const a = ring[k];
    const b = ring[(k + 1) % m];
    s += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return s;
}

function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

function onSegment(ax: number, ay: number, bx: number, by: number, px: number, py: number): boolean {
  return Math.min(ax, bx) <= px && px <= Math.max(ax, bx) && Math.min(ay, by) <= py && py <= Math.max(ay, by);
}

/** True when closed segments ab and cd share at least one point (crossing, touching or overlapping). */
export function segmentsTouch(
  a: [number, number],
  b: [number, number],
  c: [number, number],
  d: [number, number],
): boolean {
  const d1 = orient(c[0], c[1], d[0], d[1], a[0], a[1]);
  const d2 = orient(c[0], c[1], d[0], d[1], b[0], b[1]);
  const d3 = orient(a[0], a[1], b[0], b[1], c[0], c[1]);
  const d4 = orient(a[0], a[1], b[0], b[1], d[0], d[1]);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
  if (d1 === 0 && onSegment(c[0], c[1], d[0], d[1], a[0], a[1])) return true;
  if (d2 === 0 && onSegment(c[0], c[1], d[0], d[1], b[0], b[1])) return true;
  if (d3 === 0 && onSegment(a[0], a[1], b[0], b[1], c[0], c[1])) return true;
  if (d4 === 0 && onSegment(a[0], a[1], b[0], b[1], d[0], d[1])) return true;
  return false;
}

/**
 * Work counter for the ring checks: how many segment pairs were tested exactly. Tests read it to show the
 * checks stay near-linear (no timed tests); callers may leave it out.
 */
export type RingWork = { segmentTests: number };

/** A static R-tree (Flatbush, a packed Hilbert R-tree) of a ring's edge boxes: built in O(m log m). */
function edgeIndex(ring: Ring): Flatbush {
  const m = ring.length;
  const index = new Flatbush(m);
  for (let k = 0; k < m; k++) {
    const a = ring[k];
    const b = ring[(k + 1) % m];
    index.add(Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[0], b[0]), Math.max(a[1], b[1]));
  }
  index.finish();
  return index;
}

/**
 * First pair of edges of a ring that meet other than at their shared vertex (by index, as a nested loop
 * over i < j would find it), or null when the ring is simple. Only edges whose boxes meet are tested
 * exactly, found through an R-tree: O(m log m) for outlines whose edges' boxes overlap few others, as any
 * drawn or surveyed outline's do, instead of testing all m²/2 pairs.
 */
export function firstSelfContact(ring: Ring, work?: RingWork): [number, number] | null {
  const m = ring.length;
  const index = edgeIndex(ring);
  for (let i = 0; i < m; i++) {
    const a = ring[i];
    const b = ring[(i + 1) % m];
    const candidates = index.search(
      Math.min(a[0], b[0]),
      Math.min(a[1], b[1]),
      Math.max(a[0], b[0]),
      Math.max(a[1], b[1]),
      (j) => j > i,
    );
    candidates.sort((x, y) => x - y);
    for (const j of candidates) {
      if (work) work.segmentTests++;
      const c = ring[j];
      const d = ring[(j + 1) % m];
      const adjacentNext = j === i + 1;
      const adjacentPrev = i === 0 && j === m - 1;
      if (adjacentNext || adjacentPrev) {
        // Adjacent edges share one vertex; they are bad only if they fold back onto each other.
        const shared = adjacentNext ? b : a;
        const p = adjacentNext ? a : b;
        const q = adjacentNext ? d : c;
        const o = orient(p[0], p[1], shared[0], shared[1], q[0], q[1]);
        const dot = (p[0] - shared[0]) * (q[0] - shared[0]) + (p[1] - shared[1]) * (q[1] - shared[1]);
        if (o === 0 && dot > 0) return [i, j];
        continue;
      }
      if (segmentsTouch(a, b, c, d)) return [i, j];
    }
  }
  return null;
}

/** True when some edge of ring p meets some edge of ring q; only edges whose boxes meet are tested exactly. */
export function ringsTouch(p: Ring, q: Ring, work?: RingWork): boolean {
  const index = edgeIndex(q);
  for (let i = 0; i < p.length; i++) {
    const a = p[i];
    const b = p[(i + 1) % p.length];
    const hit = index.search(
      Math.min(a[0], b[0]),
      Math.min(a[1], b[1]),
      Math.max(a[0], b[0]),
      Math.max(a[1], b[1]),
      (j) => {
        if (work) work.segmentTests++;
        return segmentsTouch(a, b, q[j], q[(j + 1) % q.length]);
      },
    );
    if (hit.length > 0) return true;
  }
  return false;
}

/** Axis-aligned bounding box of a ring, as [minX, minY, maxX, maxY]. */
export function ringBox(ring: Ring): [number, number, number, number] {
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (const [x, y] of ring) {
    if (x < minX) minX = x;
    if (y < minY) minY = y;
    if (x > maxX) maxX = x;
    if (y > maxY) maxY = y;
  }
  return [minX, minY, maxX, maxY];
}

/**
 * Diameter of a point set (largest distance between two of its points): the convex hull by Andrew's
 * monotone chain (1979), then rotating calipers over its antipodal pairs (Shamos 1978). O(m log m).
 */
export function ringDiameter(ring: Ring, work?: { distanceTests: number }): number {
  const pts = ring.slice().sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  const cross = (o: [number, number], a: [number, number], b: [number, number]) =>
    (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const lower: [number, number][] = [];
  for (const p of pts) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], p) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: [number, number][] = [];
  for (let k = pts.length - 1; k >= 0; k--) {
    const p = pts[k];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], p) <= 0) upper.pop();
    upper.push(p);
  }
  const hull = lower.slice(0, -1).concat(upper.slice(0, -1));
  const n = hull.length;
  const dist = (p: [number, number], q: [number, number]) => {
    if (work) work.distanceTests++;
    return Math.hypot(p[0] - q[0], p[1] - q[1]);
  };
  if (n < 2) return 0;
  if (n === 2) return dist(hull[0], hull[1]);
  let best = 0;
  let j = 1;
  for (let i = 0; i < n; i++) {
    const a = hull[i];
    const b = hull[(i + 1) % n];
    // Advance j while the next hull vertex lies farther from the line through edge ab.
    while (cross(a, b, hull[(j + 1) % n]) > cross(a, b, hull[j])) j = (j + 1) % n;
    best = Math.max(best, dist(a, hull[j]), dist(b, hull[j]));
  }
  return best;
}

/** Even–odd point-in-ring test (Shimrat 1962 crossing rule); boundary points may fall either way. */
export function insideRing(ring: Ring, x: number, y: number): boolean {
  let inside = false;
  for (let k = 0, m = ring.length, l = m - 1; k < m; l = k++) {
    const [xk, yk] = ring[k];
    const [xl, yl] = ring[l];
    if (yk > y !== yl > y && x < ((xl - xk) * (y - yk)) / (yl - yk) + xk) inside = !inside;
  }
  return inside;
}

/**
 * Signed area of ring ∩ axis-aligned rectangle, by Sutherland–Hodgman clipping (1974). Clipping a simple
 * polygon, concave or not, against a convex region can leave zero-width slivers but its shoelace area is
 * exact, which is all the quadrat test needs.
 */
export function clippedRingArea(ring: Ring, x0: number, y0: number, x1: number, y1: number): number {
  let poly: Ring = ring;
  const planes: [number, number, number][] = [
    // inside when a·x + b·y + c >= 0
    [1, 0, -x0],
    [-1, 0, x1],
    [0, 1, -y0],
    [0, -1, y1],
  ];
  for (const [a, b, c] of planes) {
    const next: Ring = [];
    const m = poly.length;
    for (let k = 0; k < m; k++) {
      const p = poly[k];
      const q = poly[(k + 1) % m];
      const fp = a * p[0] + b * p[1] + c;
      const fq = a * q[0] + b * q[1] + c;
      if (fp >= 0) next.push(p);
      if (fp >= 0 !== fq >= 0) {
        const t = fp / (fp - fq);
        next.push([p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])]);
      }
    }
    poly = next;
    if (poly.length < 3) return 0;
  }
  return signedArea(poly);
}
