import { z } from "zod";
import { squareImportSchema, squareSampleSchema } from "@/lib/schemas/squares";
import { recorders, wireDate, type ApiOperation } from "../operation";

const id = z.string();
const gridSquare = z.object({
  col: z.number(),
  row: z.number(),
  label: z.string(),
  x0: z.number(),
  y0: z.number(),
  x1: z.number(),
  y1: z.number(),
  area: z.number(),
  whole: z.boolean(),
});
const squareCount = z.object({ classId: id, count: z.number(), weightG: z.number().nullable() });

/** One square dug in one context (and spit), with its counts per class. */
export const squareSampleView = z.object({
  id,
  trenchId: id,
  contextId: id,
  spitId: id.nullable(),
  col: z.number(),
  row: z.number(),
  label: z.string(),
  contextNumber: z.number(),
  spitNumber: z.number().nullable(),
  excavatedArea: z.number().nullable(),
  area: z.number(),
  outside: z.boolean(),
  counts: z.array(squareCount),
  updatedAt: wireDate,
});

/** A trench's square grid, its squares clipped to the outline as drawn now, and its square records. */
export const trenchSquaresView = z.object({
  trenchId: id,
  grid: z.object({ size: z.number(), originX: z.number(), originY: z.number() }).nullable(),
  squares: z.array(gridSquare),
  samples: z.array(squareSampleView),
});

/** A checked (dry run) or imported file: rows, the square records they make, and every refused row with its reasons. */
export const squareImportReport = z.object({
  dryRun: z.boolean(),
  rowCount: z.number(),
  validCount: z.number(),
  squares: z.number(),
  errors: z.array(z.object({ row: z.number(), reasons: z.array(z.string()) })),
  importId: z.string().nullable(),
});

/**
 * API operations of bulk finds counted by grid square (issue 16). The grid itself is set on the trench (trenchUpdate).
 */
export const squaresApi = {
  trenchSquares: {
    method: "GET",
    path: "/api/sites/{siteId}/trenches/{trenchId}/squares",
    summary: "A trench's square grid, its squares clipped to the outline and the counts recorded in them",
    roles: "member",
    from: "none",
    response: trenchSquaresView,
  },
  squareRecord: {
    method: "POST",
    path: "/api/sites/{siteId}/trenches/{trenchId}/squares",
    summary:
      "Record a square dug in a context (and spit) with its counts per class; replaces that square's earlier counts there",
    roles: recorders,
    doing: "record counts by square",
    input: squareSampleSchema,
  },
  squareDelete: {
    method: "DELETE",
    path: "/api/sites/{siteId}/square-records/{sampleId}",
    summary: "Delete a square record: the square goes back to not excavated there",
    roles: recorders,
    doing: "record counts by square",
    from: "none",
  },
  squareImport: {
    method: "POST",
    path: "/api/sites/{siteId}/square-import",
    summary: "Import a square-count CSV, every row or none; with dryRun, check every row and write nothing",
    roles: recorders,
    doing: "import counts by square",
    input: squareImportSchema,
    maxBodyBytes: 6 * 1024 * 1024,
    response: squareImportReport,
  },
} as const satisfies Record<string, ApiOperation>;
