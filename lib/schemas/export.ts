import { z } from "zod";
import "./messages";
import { uuid } from "./common";
import { findListQuery } from "./find";

/** Where exported coordinates live: the site grid, the site's projected CRS, or WGS 84 longitude/latitude. */
export const coordSpaces = ["grid", "crs", "lonlat"] as const;
export type CoordSpace = (typeof coordSpaces)[number];

const coords = z.enum(coordSpaces, { error: "Coordinates are grid, crs or lonlat." }).default("grid");

/** The register's own filters, so the export writes exactly what the register shows. */
export const exportFindsQuery = findListQuery
  .omit({ page: true, pageSize: true })
  .extend({ format: z.enum(["csv", "geojson"]).default("csv"), coords });
export const exportContextsQuery = z.object({ format: z.enum(["csv", "geojson"]).default("csv"), coords });
export const exportTrenchesQuery = z.object({ coords });
export const matrixQuery = z.object({ trenchId: uuid.optional() });
export const matrixImageQuery = matrixQuery.extend({ format: z.enum(["svg", "png"]).default("svg") });
/** The deposition package: the whole site, or one signed-off trench. */
export const depositionQuery = z.object({ trenchId: uuid.optional() });
