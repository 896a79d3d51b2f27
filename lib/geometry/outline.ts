import { createWindow, SpatialInputError, type Window } from "@/lib/spatial";

/** A GeoJSON Polygon in site-grid metres: first ring the trench edge, further rings holes. */
export type OutlinePolygon = { type: "Polygon"; coordinates: [number, number][][] };

export type OutlineCheck = { ok: true; window: Window } | { ok: false; reason: string };

/** Validates an outline with the engine's own window rules, so the plan and the statistics agree. */
export function checkOutline(polygon: OutlinePolygon): OutlineCheck {
  try {
    const [outer, ...holes] = polygon.coordinates;
    return { ok: true, window: createWindow({ outer: outer ?? [], holes }) };
  } catch (err) {
    if (err instanceof SpatialInputError) return { ok: false, reason: err.message };
    throw err;
  }
}

/**
 * Back to GeoJSON with RFC 7946 §3.1.6 orientation (outer ring counter-clockwise, holes clockwise) and closed rings.
 */
export function windowToPolygon(window: Window): OutlinePolygon {
  const close = (ring: readonly [number, number][]) => {
    const points = ring.map((p) => [p[0], p[1]] as [number, number]);
    const first = points[0];
    return first ? [...points, [first[0], first[1]] as [number, number]] : points;
  };
  return { type: "Polygon", coordinates: [close(window.outer), ...window.holes.map(close)] };
}

/**
 * Distance from a point outside W to W's edge, for the refusal message of a find placed outside its trench.
 */
export function distanceOutside(window: Window, x: number, y: number): number {
  return window.contains(x, y) ? 0 : window.boundaryDistance(x, y);
}
