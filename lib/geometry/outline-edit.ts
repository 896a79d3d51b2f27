/**
 * Editing steps of the plan's outline editor, on open rings (no repeated closing vertex): the first ring
 * is the trench edge, further rings are holes. Pure functions, so the canvas and the tests share them.
 */
import Papa from "papaparse";
import { firstSelfContact, insideRing, ringsTouch } from "@/lib/spatial";
import type { OutlinePolygon } from "./outline";

export type Pt = [number, number];
export type Rings = Pt[][];

/** Vertex i of a ring, indices wrapping round; an empty ring has none, which the editor never makes. */
export function vertex(ring: readonly Pt[], i: number): Pt {
  const p = ring[((i % ring.length) + ring.length) % ring.length];
  if (!p) throw new Error("An outline ring has no vertices.");
  return p;
}

/** Ring k of an outline; asking for a ring the outline does not have is a caller's mistake, said plainly. */
function ringOf(rings: Rings, k: number): Pt[] {
  const r = rings[k];
  if (!r) throw new Error(`The outline has no ring ${k + 1}.`);
  return r;
}

/** Drops a repeated closing vertex. */
export function openRing(ring: readonly Pt[]): Pt[] {
  const r = ring.map((p) => [p[0], p[1]] as Pt);
  const first = r[0],
    last = r[r.length - 1];
  if (r.length > 1 && first && last && first[0] === last[0] && first[1] === last[1]) r.pop();
  return r;
}

export function polygonToRings(polygon: OutlinePolygon): Rings {
  return polygon.coordinates.map(openRing);
}

export function ringsToPolygon(rings: Rings): OutlinePolygon {
  return {
    type: "Polygon",
    coordinates: rings.map((r) => [...r.map((p) => [p[0], p[1]] as Pt), [...vertex(r, 0)] as Pt]),
  };
}

const replaceRing = (rings: Rings, k: number, ring: Pt[]) => rings.map((r, i) => (i === k ? ring : r));

export function moveVertex(rings: Rings, k: number, v: number, to: Pt): Rings {
  return replaceRing(
    rings,
    k,
    ringOf(rings, k).map((p, i) => (i === v ? to : p)),
  );
}

/** Inserts `at` after vertex `edge` (on the edge from vertex edge to edge + 1). */
export function insertVertex(rings: Rings, k: number, edge: number, at: Pt): Rings {
  const r = ringOf(rings, k).slice();
  r.splice(edge + 1, 0, at);
  return replaceRing(rings, k, r);
}

/** Removes a vertex; a ring keeps at least three. Removing from a hole of three removes the hole. */
export function deleteVertex(rings: Rings, k: number, v: number): Rings {
  const ring = ringOf(rings, k);
  if (ring.length > 3)
    return replaceRing(
      rings,
      k,
      ring.filter((_, i) => i !== v),
    );
  if (k === 0) throw new Error("The trench edge needs at least three vertices.");
  return rings.filter((_, i) => i !== k);
}

export type EdgeHit = { ring: number; edge: number; point: Pt; distance: number };

/** The nearest point on any edge of any ring. */
export function nearestEdge(rings: Rings, x: number, y: number): EdgeHit | null {
  let best: EdgeHit | null = null;
  rings.forEach((r, k) => {
    r.forEach((a, i) => {
      const b = vertex(r, i + 1);
      const dx = b[0] - a[0];
      const dy = b[1] - a[1];
      const len2 = dx * dx + dy * dy;
      const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((x - a[0]) * dx + (y - a[1]) * dy) / len2));
      const p: Pt = [a[0] + t * dx, a[1] + t * dy];
      const d = Math.hypot(p[0] - x, p[1] - y);
      if (!best || d < best.distance) best = { ring: k, edge: i, point: p, distance: d };
    });
  });
  return best;
}

export type Problem = { ring: number; edges: number[]; rings?: number[] };

/** Where an outline is wrong, for drawing the refusal on the plan (the reason text comes from checkOutline). */
export function locateProblem(rings: Rings): Problem | null {
  for (const [k, ring] of rings.entries()) {
    if (ring.length < 3) return { ring: k, edges: [] };
    const hit = firstSelfContact(ring);
    if (hit) return { ring: k, edges: hit };
  }
  const [outer, ...holes] = rings;
  if (!outer) return null;
  for (const [h, hole] of holes.entries()) {
    const k = h + 1;
    const [hx, hy] = vertex(hole, 0);
    if (ringsTouch(hole, outer) || !insideRing(outer, hx, hy)) return { ring: k, edges: [], rings: [0, k] };
    for (const [l, g] of holes.slice(0, h).entries()) {
      const [gx, gy] = vertex(g, 0);
      if (ringsTouch(hole, g) || insideRing(g, hx, hy) || insideRing(hole, gx, gy))
        return { ring: k, edges: [], rings: [l + 1, k] };
    }
  }
  return null;
}

function ringsFromGeoJson(value: unknown): Rings {
  const v = value as { type?: string; coordinates?: unknown; geometry?: unknown; features?: unknown[] };
  if (v?.type === "FeatureCollection") {
    const first = (v.features ?? []).find((f) =>
      ["Polygon", "MultiPolygon"].includes((f as { geometry?: { type?: string } })?.geometry?.type ?? ""),
    );
    if (!first) throw new Error("The GeoJSON holds no Polygon feature.");
    return ringsFromGeoJson((first as { geometry: unknown }).geometry);
  }
  if (v?.type === "Feature") return ringsFromGeoJson(v.geometry);
  if (v?.type === "MultiPolygon") {
    const polys = v.coordinates as Pt[][][];
    if (polys.length !== 1)
      throw new Error(`The GeoJSON MultiPolygon has ${polys.length} parts; a trench outline is one polygon.`);
    return ringsFromGeoJson({ type: "Polygon", coordinates: polys[0] ?? [] });
  }
  if (v?.type !== "Polygon" || !Array.isArray(v.coordinates))
    throw new Error(`GeoJSON of type ${v?.type ?? "unknown"} is not a Polygon.`);
  return (v.coordinates as unknown[][]).map((ring, k) =>
    openRing(
      ring.map((p, i) => {
        const q = p as unknown[];
        if (!Array.isArray(q) || !Number.isFinite(q[0]) || !Number.isFinite(q[1]))
          throw new Error(`Ring ${k + 1}, position ${i + 1} is not [x, y].`);
        return [Number(q[0]), Number(q[1])] as Pt;
      }),
    ),
  );
}

/**
 * Reads pasted coordinates: GeoJSON (Polygon, MultiPolygon of one part, Feature, FeatureCollection) or
 * CSV of x,y per line, optional header, with a blank line (or a third column `ring` 0, 1, 2…) starting
 * each hole. Throws with the line at fault.
 */
export function parseOutlineText(text: string): Rings {
  const trimmed = text.trim();
  if (!trimmed) throw new Error("Paste coordinates first.");
  if (trimmed.startsWith("{")) {
    let json: unknown;
    try {
      json = JSON.parse(trimmed);
    } catch (err) {
      throw new Error(`The text starts like GeoJSON but is not valid JSON (${(err as Error).message}).`);
    }
    return ringsFromGeoJson(json);
  }
  const rows = Papa.parse<string[]>(trimmed, { skipEmptyLines: false, delimiter: "" }).data;
  let current: Pt[] = [];
  const rings: Rings = [current];
  let byColumn = false;
  rows.forEach((row, i) => {
    const cells = row.map((c) => c.trim());
    if (cells.every((c) => c === "")) {
      if (!byColumn && current.length) rings.push((current = []));
      return;
    }
    if (i === 0 && cells.some((c) => c !== "" && !Number.isFinite(Number(c)))) return; // header
    const [x, y, ring] = cells.map(Number);
    if (x === undefined || y === undefined || !Number.isFinite(x) || !Number.isFinite(y))
      throw new Error(`Line ${i + 1} ("${row.join(",")}") is not two numbers x,y.`);
    if (ring !== undefined && cells[2] !== "") {
      byColumn = true;
      if (!Number.isInteger(ring) || ring < 0)
        throw new Error(`Line ${i + 1}: the ring column must be 0 for the edge, 1, 2… for holes.`);
      while (rings.length <= ring) rings.push([]);
      ringOf(rings, ring).push([x, y]);
    } else {
      current.push([x, y]);
    }
  });
  const out = rings.filter((r) => r.length).map(openRing);
  if (!out.length) throw new Error("No coordinates found.");
  return out;
}
