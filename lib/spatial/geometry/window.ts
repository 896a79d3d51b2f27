/**
 * The study area W: a trench outline with holes. Validation follows the OGC simple-features rules for a
 * polygon (simple rings, holes strictly inside the outer ring and disjoint from each other).
 *
 * Self-crossing is checked by hand-written segment tests rather than @turf/turf's `kinks`: importing the
 * turf bundle costs about 0.2 s per process, and every worker thread builds its own window. The tests use
 * turf's `kinks` as the outside check of this rule. Only edges whose boxes meet are tested (an R-tree), and
 * rings and holes are bounded in size (./limits.ts), so building a window is bounded, near-linear work.
 */
import { SpatialInputError } from "../errors";
import { formatLimit, MAX_HOLES, MAX_RING_VERTICES } from "./limits";
import {
  cleanRing,
  firstSelfContact,
  insideRing,
  ringBox,
  ringDiameter,
  ringLength,
  ringsTouch,
  signedArea,
} from "./ring";
import type { BBox, Ring, Window, WindowInput } from "../types";

/** Counts of the exact tests a window's checks made (see ring.ts); for the tests of its cost. */
export type WindowWork = { segmentTests: number; distanceTests: number };

function assertRingSize(ring: Ring, label: string): void {
  if (!Array.isArray(ring)) return; // cleanRing names the problem
  const closed =
    ring.length > 1 && ring[0]?.[0] === ring[ring.length - 1]?.[0] && ring[0]?.[1] === ring[ring.length - 1]?.[1];
  const vertices = closed ? ring.length - 1 : ring.length;
  if (vertices > MAX_RING_VERTICES) {
    throw new SpatialInputError(
      `The ${label} has ${formatLimit(vertices)} vertices; at most ${formatLimit(MAX_RING_VERTICES)} are allowed. Draw it with fewer.`,
    );
  }
}

function orientRing(ring: Ring, counterClockwise: boolean): Ring {
  const ccw = signedArea(ring) > 0;
  return ccw === counterClockwise ? ring : ring.slice().reverse();
}

function allCollinear(ring: Ring): boolean {
  const [a, b] = ring;
  return ring.every((c) => (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]) === 0);
}

function validateRing(ring: Ring, label: string, work?: WindowWork): void {
  if (allCollinear(ring)) throw new SpatialInputError(`The ${label} has zero area (its vertices are collinear).`);
  const contact = firstSelfContact(ring, work);
  if (contact) {
    throw new SpatialInputError(
      `The ${label} crosses or touches itself (edges ${contact[0] + 1} and ${contact[1] + 1}); draw it as a simple outline.`,
    );
  }
}

/** Build a validated, frozen window from an outline and holes. Throws SpatialInputError on bad geometry. */
export function createWindow(input: WindowInput, work?: WindowWork): Window {
  if (!input || typeof input !== "object") throw new SpatialInputError("The trench window is missing.");
  const inputHoles = input.holes ?? [];
  if (inputHoles.length > MAX_HOLES) {
    throw new SpatialInputError(
      `The outline has ${formatLimit(inputHoles.length)} holes; at most ${formatLimit(MAX_HOLES)} are allowed.`,
    );
  }
  assertRingSize(input.outer, "outer ring");
  inputHoles.forEach((h, k) => assertRingSize(h, `hole ${k + 1}`));
  const outer = orientRing(cleanRing(input.outer, "outer ring"), true);
  validateRing(outer, "outer ring", work);
  const holes = inputHoles.map((h, k) => {
    const ring = orientRing(cleanRing(h, `hole ${k + 1}`), false);
    validateRing(ring, `hole ${k + 1}`, work);
    return ring;
  });
  // Boxes first: two rings whose boxes are apart can neither touch nor nest, which spares the exact tests.
  const boxes = holes.map(ringBox);
  const apart = (p: number[], q: number[]) => p[2] < q[0] || q[2] < p[0] || p[3] < q[1] || q[3] < p[1];
  holes.forEach((h, k) => {
    if (ringsTouch(h, outer, work) || !insideRing(outer, h[0][0], h[0][1])) {
      throw new SpatialInputError(`Hole ${k + 1} is not strictly inside the outer ring.`);
    }
    for (let l = 0; l < k; l++) {
      if (apart(boxes[k], boxes[l])) continue;
      const g = holes[l];
      if (ringsTouch(h, g, work) || insideRing(g, h[0][0], h[0][1]) || insideRing(h, g[0][0], g[0][1])) {
        throw new SpatialInputError(`Holes ${l + 1} and ${k + 1} overlap or touch; merge them into one hole.`);
      }
    }
  });

  const rings = [outer, ...holes];
  const edgeCount = rings.reduce((s, r) => s + r.length, 0);
  const edges = new Float64Array(edgeCount * 4);
  const ringStart = new Int32Array(rings.length + 1);
  let e = 0;
  rings.forEach((ring, k) => {
    ringStart[k] = e;
    for (let v = 0; v < ring.length; v++, e++) {
      const a = ring[v];
      const b = ring[(v + 1) % ring.length];
      edges[4 * e] = a[0];
      edges[4 * e + 1] = a[1];
      edges[4 * e + 2] = b[0];
      edges[4 * e + 3] = b[1];
    }
  });
  ringStart[rings.length] = e;

  const area = signedArea(outer) + holes.reduce((s, h) => s + signedArea(h), 0);
  const perimeter = rings.reduce((s, r) => s + ringLength(r), 0);
  const bbox: BBox = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
  for (const [x, y] of outer) {
    bbox.minX = Math.min(bbox.minX, x);
    bbox.minY = Math.min(bbox.minY, y);
    bbox.maxX = Math.max(bbox.maxX, x);
    bbox.maxY = Math.max(bbox.maxY, y);
  }
  // The diameter of a polygon is attained between two vertices of its convex hull.
  const diameter = ringDiameter(outer, work);
  const tolerance = 1e-9 * Math.max(bbox.maxX - bbox.minX, bbox.maxY - bbox.minY);

  const boundaryDistance = (x: number, y: number): number => {
    let best = Infinity;
    for (let k = 0; k < edgeCount; k++) {
      const ax = edges[4 * k];
      const ay = edges[4 * k + 1];
      const dx = edges[4 * k + 2] - ax;
      const dy = edges[4 * k + 3] - ay;
      let t = ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy);
      t = t < 0 ? 0 : t > 1 ? 1 : t;
      const ex = ax + t * dx - x;
      const ey = ay + t * dy - y;
      const d2 = ex * ex + ey * ey;
      if (d2 < best) best = d2;
    }
    return Math.sqrt(best);
  };

  const contains = (x: number, y: number): boolean => {
    if (
      x < bbox.minX - tolerance ||
      x > bbox.maxX + tolerance ||
      y < bbox.minY - tolerance ||
      y > bbox.maxY + tolerance
    ) {
      return false;
    }
    // Even–odd crossing count over all rings at once: holes flip the parity back.
    let inside = false;
    for (let k = 0; k < edgeCount; k++) {
      const ax = edges[4 * k];
      const ay = edges[4 * k + 1];
      const bx = edges[4 * k + 2];
      const by = edges[4 * k + 3];
      if (ay > y !== by > y && x < ((bx - ax) * (y - ay)) / (by - ay) + ax) inside = !inside;
    }
    // A find digitised exactly on the trench edge belongs to the trench.
    return inside || boundaryDistance(x, y) <= tolerance;
  };

  return Object.freeze({
    outer,
    holes: Object.freeze(holes),
    area,
    perimeter,
    bbox: Object.freeze(bbox),
    diameter,
    edges,
    edgeCount,
    ringStart,
    contains,
    boundaryDistance,
  });
}

/** Convenience: an axis-aligned rectangular window [x0, x1] × [y0, y1]. */
export function rectangleWindow(x0: number, y0: number, x1: number, y1: number): Window {
  return createWindow({
    outer: [
      [x0, y0],
      [x1, y0],
      [x1, y1],
      [x0, y1],
    ],
  });
}
