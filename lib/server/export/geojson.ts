import type { PolygonJson, Site } from "@/db/schema";
import { checkOutline, windowToPolygon } from "@/lib/geometry/outline";
import { REDUCED_LEVEL_WORDS } from "@/lib/schemas/common";
import type { CoordSpace } from "@/lib/schemas/export";
import { describeSpace, makeTransform } from "./coords";

type Position = [number, number] | [number, number, number];
type Feature = {
  type: "Feature";
  id?: string;
  geometry: { type: "Point"; coordinates: Position } | { type: "Polygon"; coordinates: Position[][] } | null;
  properties: Record<string, unknown>;
};

/** Twice the signed area of a ring (shoelace formula); positive when counter-clockwise. */
export function signedArea2(ring: readonly (readonly [number, number, ...number[]])[]): number {
  let s = 0;
  let prev: (typeof ring)[number] | undefined;
  for (const p of ring) {
    if (prev) s += prev[0] * p[1] - p[0] * prev[1];
    prev = p;
  }
  return s;
}

/**
 * A polygon in the target space with RFC 7946 §3.1.6 orientation: the exterior ring counter-clockwise,
 * holes clockwise, every ring closed. Rings are re-oriented after transforming, since a projection may
 * in principle flip them. Returns null for an outline that is not a valid window.
 */
export function exportPolygon(
  polygon: PolygonJson,
  t: (x: number, y: number) => [number, number],
): Position[][] | null {
  const check = checkOutline(polygon);
  if (!check.ok) return null;
  return windowToPolygon(check.window).coordinates.map((ring, k) => {
    const out = ring.map(([x, y]) => t(x, y));
    const ccw = signedArea2(out) > 0;
    return (k === 0) === ccw ? out : out.reverse();
  });
}

export function featureCollection(site: Site, space: CoordSpace, name: string, features: Feature[]) {
  // "coordinateSpace" is a foreign member (RFC 7946 §6.1): files in site-grid or CRS coordinates are an
  // arrangement between the parties (§4), so the file says which numbers it holds.
  // "heights" (also a foreign member) says what a third coordinate is: a reduced level against the site's datum.
  return {
    type: "FeatureCollection" as const,
    name,
    coordinateSpace: describeSpace(site, space),
    heights: { z: REDUCED_LEVEL_WORDS, datum: site.datumName, datumKind: site.datumKind },
    features,
  };
}

export type ExportFind = {
  id: string;
  number: number;
  x: number;
  y: number;
  z: number | null;
  trenchCode: string;
  contextNumber: number;
  classCode: string;
  classLabel: string;
  count: number | null;
  weightG: number | null;
  description: string;
  recordedAt: Date;
};

export function findsGeoJson(site: Site, space: CoordSpace, rows: ExportFind[]) {
  const t = makeTransform(site, space);
  const features: Feature[] = rows.map((f) => {
    const [x, y] = t(f.x, f.y);
    // Position order is x (easting / longitude) then y (northing / latitude), then z: RFC 7946 §3.1.1.
    const coordinates: Position = f.z === null ? [x, y] : [x, y, f.z];
    return {
      type: "Feature",
      id: String(f.number),
      geometry: { type: "Point", coordinates },
      properties: {
        number: f.number,
        trench: f.trenchCode,
        context: f.contextNumber,
        class: f.classCode,
        classLabel: f.classLabel,
        count: f.count,
        weightG: f.weightG,
        description: f.description,
        recordedAt: f.recordedAt.toISOString(),
      },
    };
  });
  return featureCollection(site, space, `${site.code} finds`, features);
}

export function outlinesGeoJson(
  site: Site,
  space: CoordSpace,
  name: string,
  items: { id: string; polygon: PolygonJson | null; properties: Record<string, unknown> }[],
) {
  const t = makeTransform(site, space);
  const features: Feature[] = items.map((it) => {
    const coordinates = it.polygon ? exportPolygon(it.polygon, t) : null;
    return {
      type: "Feature",
      id: it.id,
      geometry: coordinates ? { type: "Polygon", coordinates } : null,
      properties: it.properties,
    };
  });
  return featureCollection(site, space, name, features);
}
