import type { Site } from "@/db/schema";
import { isWkt } from "./coords";
import type { GpkgSrs } from "./geopackage";

/** GeoPackage srs_ids for systems no registry names: from 100000 up, clear of the EPSG codes. */
export const SITE_GRID_SRS_ID = 100000;
const UNREGISTERED_SRS_ID = 100001;

/** WKT1 names are quoted with no escape (OGC 01-009): keep a double quote out of them. */
const wktName = (s: string) => s.replace(/"/g, "'");

/**
 * The site grid as a local engineering CRS (OGC WKT1 LOCAL_CS; WKT2 calls it ENGCRS): metres, x east,
 * y north, tied to no place on Earth. It is what the site's own numbers mean, placed or not.
 */
export function siteGridSrs(site: Site): GpkgSrs {
  const name = wktName(`${site.code} site grid`);
  return {
    srsId: SITE_GRID_SRS_ID,
    name,
    organization: "NONE",
    organizationCode: SITE_GRID_SRS_ID,
    definition: `LOCAL_CS["${name}",LOCAL_DATUM["${wktName(site.name)} site grid origin",32767],UNIT["metre",1,AUTHORITY["EPSG","9001"]],AXIS["Easting",EAST],AXIS["Northing",NORTH]]`,
    description: site.gridDescription || `the site grid of ${site.code}, metres (x east, y north)`,
  };
}

/** The EPSG code a WKT names for the whole CRS: its last AUTHORITY (WKT1) or ID (WKT2), closing the definition. */
export function epsgCodeOf(wkt: string): number | null {
  const m =
    /AUTHORITY\s*\[\s*"EPSG"\s*,\s*"?(\d+)"?\s*\]\s*\]\s*$/i.exec(wkt) ??
    /ID\s*\[\s*"EPSG"\s*,\s*(\d+)\s*\]\s*\]\s*$/i.exec(wkt);
  return m?.[1] ? Number(m[1]) : null;
}

/**
 * The site's projected CRS as a GeoPackage SRS, or null when the site is not placed or its CRS is a bare
 * proj4 definition (a GeoPackage names its systems in WKT, which proj4 definitions cannot be turned into here).
 */
export function projectedSrs(site: Site): GpkgSrs | null {
  const raw = site.crs?.trim();
  if (!raw || !isWkt(raw)) return null;
  const code = epsgCodeOf(raw);
  const name = /^\s*\w+\s*\[\s*"([^"]*)"/.exec(raw)?.[1] ?? `${site.code} projected CRS`;
  return {
    srsId: code ?? UNREGISTERED_SRS_ID,
    name,
    organization: code ? "EPSG" : "NONE",
    organizationCode: code ?? UNREGISTERED_SRS_ID,
    definition: raw,
    description: `the projected CRS ${site.code} is placed in`,
  };
}
