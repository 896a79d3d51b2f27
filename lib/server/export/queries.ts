import { z } from "zod";
import { uuid } from "@/lib/schemas/common";
import { findListQuery } from "@/lib/schemas/find";
import { coordSpaces } from "./coords";

const coords = z.enum(coordSpaces, { error: "Coordinates are grid, crs or lonlat." }).default("grid");

/** The register's own filters, so the export writes exactly what the register shows. */
export const exportFindsQuery = findListQuery.omit({ page: true, pageSize: true }).extend({ format: z.enum(["csv", "geojson"]).default("csv"), coords });
export const exportContextsQuery = z.object({ format: z.enum(["csv", "geojson"]).default("csv"), coords });
export const exportTrenchesQuery = z.object({ coords });
export const matrixQuery = z.object({ trenchId: uuid.optional() });
export const matrixImageQuery = matrixQuery.extend({ format: z.enum(["svg", "png"]).default("svg") });
