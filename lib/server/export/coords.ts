import proj4 from "proj4";
import type { Site } from "@/db/schema";
import type { CoordSpace } from "@/lib/schemas/export";
import { badInput } from "@/lib/server/errors";

export type Transform = (x: number, y: number) => [number, number];

/** An OGC WKT definition of a projected CRS (WKT1 PROJCS or WKT2 PROJCRS), as the EPSG registry publishes it. */
export const isWkt = (def: string) => /^\s*(PROJCS|PROJCRS|PROJECTEDCRS)\s*\[/i.test(def);

/**
 * The site's CRS as proj4 understands it: OGC WKT as it stands, a proj4 string (anything from "+proj="
 * on), or a name proj4 knows (EPSG:4326, EPSG:3857, …). The site grid is taken as aligned with the CRS
 * axes, its origin at (gridOriginX, gridOriginY) in CRS units (metres).
 */
function crsDefinition(site: Site): string {
  const raw = site.crs?.trim();
  if (!raw)
    throw badInput(
      `Site ${site.code} is not placed in a projected CRS; download the GeoPackage (its site-grid layers carry the grid as their own coordinate system), or ask a director to place the site in Settings.`,
    );
  const at = isWkt(raw) ? -1 : raw.indexOf("+proj=");
  const def = at >= 0 ? raw.slice(at) : raw;
  try {
    proj4(def, "WGS84", [site.gridOriginX, site.gridOriginY]);
  } catch (err) {
    throw badInput(`The site's CRS "${raw}" is not one proj4 can use: ${(err as Error).message ?? err}`);
  }
  return def;
}

export function makeTransform(site: Site, space: CoordSpace): Transform {
  if (space === "grid") return (x, y) => [x, y];
  const ox = site.gridOriginX;
  const oy = site.gridOriginY;
  if (space === "crs") {
    crsDefinition(site);
    return (x, y) => [ox + x, oy + y];
  }
  const def = crsDefinition(site);
  const converter = proj4(def, "WGS84");
  return (x, y) => converter.forward([ox + x, oy + y]) as [number, number];
}

/** Words for the file and the screen, saying plainly what the numbers are. */
export function describeSpace(site: Site, space: CoordSpace): string {
  if (space === "grid") return `site grid of ${site.code}, metres (x east, y north)`;
  if (space === "crs") return `projected CRS of ${site.code}: ${site.crs}`;
  return "WGS 84 longitude, latitude (RFC 7946 default)";
}
