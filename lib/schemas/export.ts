import { z } from "zod";
import "./messages";
import { uuid } from "./common";
import { findListQuery } from "./find";

/** Where exported coordinates live: the site grid, the site's projected CRS, or WGS 84 longitude/latitude. */
export const coordSpaces = ["grid", "crs", "lonlat"] as const;
export type CoordSpace = (typeof coordSpaces)[number];

/**
 * GeoJSON is WGS 84 longitude/latitude only (RFC 7946 §4: no other CRS can be named in it); site-grid and
 * projected coordinates go out in the GeoPackage, which names its own systems.
 */
const coords = z
  .enum(["lonlat"], {
    error:
      "GeoJSON holds WGS 84 longitude/latitude only (RFC 7946); for site-grid or projected coordinates download the GeoPackage (export/gis).",
  })
  .optional();

/** The register's own filters, so the export writes exactly what the register shows. */
export const exportFindsQuery = findListQuery
  .omit({ page: true, pageSize: true })
  .extend({ format: z.enum(["csv", "geojson"]).default("csv"), coords });
export const exportContextsQuery = z.object({ format: z.enum(["csv", "geojson"]).default("csv"), coords });
export const exportTrenchesQuery = z.object({ coords });
export const matrixQuery = z.object({ trenchId: uuid.optional() });
export const matrixImageQuery = matrixQuery.extend({ format: z.enum(["svg", "png"]).default("svg") });
/** The GeoPackage of GIS layers: the whole site, or one trench. */
export const exportGisQuery = z.object({ trenchId: uuid.optional() });
/** The deposition package: the whole site, or one signed-off trench. */
export const depositionQuery = z.object({ trenchId: uuid.optional() });
