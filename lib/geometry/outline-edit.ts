/**
 * Editing steps of the plan's outline editor, on open rings (no repeated closing vertex): the first ring
 * is the trench edge, further rings are holes. Pure functions, so the canvas and the tests share them.
 */
import Papa from "papaparse";
import { firstSelfContact, insideRing, ringsTouch } from "@/lib/spatial";
import type { OutlinePolygon } from "./outline";

export type Pt = [number, number];
export type Rings = Pt[][];

/** Drops a repeated closing vertex. */
export function openRing(ring: readonly Pt[]): Pt[] {
  const r = ring.map((p) => [p[0], p[1]] as Pt);
  if (r.length > 1 && r[0][0] === r[r.length - 1][0] && r[0][1] === r[r.length - 1][1]) r.pop();
  return r;
}

export function polygonToRings(polygon: OutlinePolygon): Rings {
  return polygon.coordinates.map(openRing);
}

export function ringsToPolygon(rings: Rings): OutlinePolygon {
  return { type: "Polygon", coordinates: rings.map((r) => [...r.map((p) => [p[0], p[1]] as Pt), [r[0][0], r[0][1]] as Pt]) };
}

const replaceRing = (rings: Rings, k: number, ring: Pt[]) => rings.map((r, i) => (i === k ? ring : r));

export function moveVertex(rings: Rings, k: number, v: number, to: Pt): Rings {
  return replaceRing(rings, k, rings[k].map((p, i) => (i === v ? to : p)));
}

/** Inserts `at` after vertex `edge` (on the edge from vertex edge to edge + 1). */
export function insertVertex(rings: Rings, k: number, edge: number, at: Pt): Rings {
  const r = rings[k].slice();
  r.splice(edge + 1, 0, at);
  return replaceRing(rings, k, r);
}

/** Removes a vertex; a ring keeps at least three. Removing from a hole of three removes the hole. */
export function deleteVertex(rings: Rings, k: number, v: number): Rings {
  if (rings[k].length > 3) return replaceRing(rings, k, rings[k].filter((_, i) => i !== v));
  if (k === 0) throw new Error("The trench edge needs at least three vertices.");
  return rings.filter((_, i) => i !== k);
}

export type EdgeHit = { ring: number; edge: number; point: Pt; distance: number };

/** The nearest point on any edge of any ring. */
export function nearestEdge(rings: Rings, x: number, y: number): EdgeHit | null {
  let best: EdgeHit | null = null;
  rings.forEach((r, k) => {
    for (let i = 0; i < r.length; i++) {
      const a = r[i];
      const b = r[(i + 1) % r.length];
      const dx = b[0] - a[0];
      const dy = b[1] - a[1];
      const len2 = dx * dx + dy * dy;
      const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((x - a[0]) * dx + (y - a[1]) * dy) / len2));
      const p: Pt = [a[0] + t * dx, a[1] + t * dy];
      const d = Math.hypot(p[0] - x, p[1] - y);
      if (!best || d < best.distance) best = { ring: k, edge: i, point: p, distance: d };
    }
  });
  return best;
}

export type Problem = { ring: number; edges: number[]; rings?: number[] };

/** Where an outline is wrong, for drawing the refusal on the plan (the reason text comes from checkOutline). */
export function locateProblem(rings: Rings): Problem | null {
  for (let k = 0; k < rings.length; k++) {
    if (rings[k].length < 3) return { ring: k, edges: [] };
    const hit = firstSelfContact(rings[k]);
    if (hit) return { ring: k, edges: hit };
  }
  const outer = rings[0];
  for (let k = 1; k < rings.length; k++) {
    if (ringsTouch(rings[k], outer) || !insideRing(outer, rings[k][0][0], rings[k][0][1])) return { ring: k, edges: [], rings: [0, k] };
    for (let l = 1; l < k; l++) {
      const g = rings[l];
      if (ringsTouch(rings[k], g) || insideRing(g, rings[k][0][0], rings[k][0][1]) || insideRing(rings[k], g[0][0], g[0][1])) return { ring: k, edges: [], rings: [l, k] };
    }
  }
  return null;
}

function ringsFromGeoJson(value: unknown): Rings {
  const v = value as { type?: string; coordinates?: unknown; geometry?: unknown; features?: unknown[] };
  if (v?.type === "FeatureCollection") {
    const first = (v.features ?? []).find((f) => ["Polygon", "MultiPolygon"].includes((f as { geometry?: { type?: string } })?.geometry?.type ?? ""));
    if (!first) throw new Error("The GeoJSON holds no Polygon feature.");
    return ringsFromGeoJson((first as { geometry: unknown }).geometry);
  }
  if (v?.type === "Feature") return ringsFromGeoJson(v.geometry);
  if (v?.type === "MultiPolygon") {
    const polys = v.coordinates as Pt[][][];
    if (polys.length !== 1) throw new Error(`The GeoJSON MultiPolygon has ${polys.length} parts; a trench outline is one polygon.`);
    return ringsFromGeoJson({ type: "Polygon", coordinates: polys[0] });
  }
  if (v?.type !== "Polygon" || !Array.isArray(v.coordinates)) throw new Error(`GeoJSON of type ${v?.type ?? "unknown"} is not a Polygon.`);
  return (v.coordinates as unknown[][]).map((ring, k) =>
    openRing(
      ring.map((p, i) => {
        const q = p as unknown[];
        if (!Array.isArray(q) || !Number.isFinite(q[0]) || !Number.isFinite(q[1])) throw new Error(`Ring ${k + 1}, position ${i + 1} is not [x, y].`);
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
  const rings: Rings = [[]];
  let byColumn = false;
  rows.forEach((row, i) => {
    const cells = row.map((c) => c.trim());
    if (cells.every((c) => c === "")) {
      if (!byColumn && rings[rings.length - 1].length) rings.push([]);
      return;
    }
    if (i === 0 && cells.some((c) => c !== "" && !Number.isFinite(Number(c)))) return; // header
    const [x, y, ring] = cells.map(Number);
    if (!Number.isFinite(x) || !Number.isFinite(y)) throw new Error(`Line ${i + 1} ("${row.join(",")}") is not two numbers x,y.`);
    if (cells.length >= 3 && cells[2] !== "") {
      byColumn = true;
      if (!Number.isInteger(ring) || ring < 0) throw new Error(`Line ${i + 1}: the ring column must be 0 for the edge, 1, 2… for holes.`);
      while (rings.length <= ring) rings.push([]);
      rings[ring].push([x, y]);
    } else {
      rings[rings.length - 1].push([x, y]);
    }
  });
  const out = rings.filter((r) => r.length).map(openRing);
  if (!out.length) throw new Error("No coordinates found.");
  return out;
}
