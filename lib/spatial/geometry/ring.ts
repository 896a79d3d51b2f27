/** Plane geometry of single rings: cleaning, signed area (shoelace), segment crossing, clipping. */
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
  return (
    Math.min(ax, bx) <= px && px <= Math.max(ax, bx) && Math.min(ay, by) <= py && py <= Math.max(ay, by)
  );
}

/** True when closed segments ab and cd share at least one point (crossing, touching or overlapping). */
export function segmentsTouch(a: [number, number], b: [number, number], c: [number, number], d: [number, number]): boolean {
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
 * First pair of edges of a ring that meet other than at their shared vertex, or null when the ring is
 * simple. O(m²), which is fine for trench outlines of tens to hundreds of vertices.
 */
export function firstSelfContact(ring: Ring): [number, number] | null {
  const m = ring.length;
  for (let i = 0; i < m; i++) {
    const a = ring[i];
    const b = ring[(i + 1) % m];
    for (let j = i + 1; j < m; j++) {
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

/** True when some edge of ring p meets some edge of ring q. */
export function ringsTouch(p: Ring, q: Ring): boolean {
  for (let i = 0; i < p.length; i++) {
    const a = p[i];
    const b = p[(i + 1) % p.length];
    for (let j = 0; j < q.length; j++) {
      if (segmentsTouch(a, b, q[j], q[(j + 1) % q.length])) return true;
    }
  }
  return false;
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
      if ((fp >= 0) !== (fq >= 0)) {
        const t = fp / (fp - fq);
        next.push([p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])]);
      }
    }
    poly = next;
    if (poly.length < 3) return 0;
  }
  return signedArea(poly);
}
