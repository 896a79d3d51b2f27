/**
 * The study area W: a trench outline with holes. Validation follows the OGC simple-features rules for a
 * polygon (simple rings, holes strictly inside the outer ring and disjoint from each other).
 *
 * Self-crossing is checked by hand-written segment tests rather than @turf/turf's `kinks`: importing the
 * turf bundle costs about 0.2 s per process, and every worker thread builds its own window. The tests use
 * turf's `kinks` as the outside check of this rule.
 */
import { SpatialInputError } from "../errors";
import { cleanRing, firstSelfContact, insideRing, ringLength, ringsTouch, signedArea } from "./ring";
import type { BBox, Ring, Window, WindowInput } from "../types";

function orientRing(ring: Ring, counterClockwise: boolean): Ring {
  const ccw = signedArea(ring) > 0;
  return ccw === counterClockwise ? ring : ring.slice().reverse();
}

function allCollinear(ring: Ring): boolean {
  const [a, b] = ring;
  return ring.every((c) => (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]) === 0);
}

function validateRing(ring: Ring, label: string): void {
  if (allCollinear(ring)) throw new SpatialInputError(`The ${label} has zero area (its vertices are collinear).`);
  const contact = firstSelfContact(ring);
  if (contact) {
    throw new SpatialInputError(
      `The ${label} crosses or touches itself (edges ${contact[0] + 1} and ${contact[1] + 1}); draw it as a simple outline.`,
    );
  }
}

/** Build a validated, frozen window from an outline and holes. Throws SpatialInputError on bad geometry. */
export function createWindow(input: WindowInput): Window {
  if (!input || typeof input !== "object") throw new SpatialInputError("The trench window is missing.");
  const outer = orientRing(cleanRing(input.outer, "outer ring"), true);
  validateRing(outer, "outer ring");
  const holes = (input.holes ?? []).map((h, k) => {
    const ring = orientRing(cleanRing(h, `hole ${k + 1}`), false);
    validateRing(ring, `hole ${k + 1}`);
    return ring;
  });
  holes.forEach((h, k) => {
    if (ringsTouch(h, outer) || !insideRing(outer, h[0][0], h[0][1])) {
      throw new SpatialInputError(`Hole ${k + 1} is not strictly inside the outer ring.`);
    }
    for (let l = 0; l < k; l++) {
      const g = holes[l];
      if (ringsTouch(h, g) || insideRing(g, h[0][0], h[0][1]) || insideRing(h, g[0][0], g[0][1])) {
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
  let diameter = 0;
  for (let i = 0; i < outer.length; i++) {
    for (let j = i + 1; j < outer.length; j++) {
      diameter = Math.max(diameter, Math.hypot(outer[i][0] - outer[j][0], outer[i][1] - outer[j][1]));
    }
  }
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
    if (x < bbox.minX - tolerance || x > bbox.maxX + tolerance || y < bbox.minY - tolerance || y > bbox.maxY + tolerance) {
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
  return createWindow({ outer: [[x0, y0], [x1, y0], [x1, y1], [x0, y1]] });
}
