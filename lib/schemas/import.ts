import { z } from "zod";
import "./messages";

/**
 * The find fields a total-station column can be mapped to. The station's point ID is its own field; a
 * file's column feeds the find number only when mapped to it on purpose, else the server allocates them.
 */
export const importFields = [
  "stationPoint",
  "x",
  "y",
  "z",
  "classCode",
  "contextNumber",
  "count",
  "weightG",
  "description",
  "number",
] as const;
export type ImportField = (typeof importFields)[number];

export const importFieldLabels: Record<ImportField, string> = {
  stationPoint: "Station point ID",
  number: "Find number (only if the file carries them)",
  x: "x (easting, m)",
  y: "y (northing, m)",
  z: "z (level, m)",
  classCode: "Class code",
  contextNumber: "Context",
  count: "Count",
  weightG: "Weight (g)",
  description: "Description",
};

const column = z.string().trim().min(1).max(200);

/** Which header of the file feeds each field; x, y, class and context are needed, the rest optional. */
export const importMappingSchema = z.object({
  stationPoint: column.optional(),
  number: column.optional(),
  x: column,
  y: column,
  z: column.optional(),
  classCode: column,
  contextNumber: column,
  count: column.optional(),
  weightG: column.optional(),
  description: column.optional(),
});
export type ImportMapping = z.infer<typeof importMappingSchema>;

/** What the import page says it reads, before a file is chosen: each field and the headers it recognises. */
export const importColumnHints: Record<ImportField, string> = {
  stationPoint: "Pt, Point, Point ID, Station point — kept with the find, never used as its number",
  x: "x, E, East, Easting",
  y: "y, N, North, Northing",
  z: "z, RL, Level, Elevation, Height — a reduced level on the site datum",
  classCode: "Class, Class code, Code",
  contextNumber: "Context, Ctx, Context no",
  count: "Count, Qty",
  weightG: "Weight, Wt, Grams",
  description: "Description, Note, Remarks",
  number: "Find no, Find number, number (as Loamwork exports it) — otherwise numbers are allocated",
};

/** About 30 MB of CSV: far beyond a day's total-station export (50,000 rows is about 3 MB). */
export const MAX_IMPORT_CHARS = 30_000_000;
/** The import request's body: the file travels as a JSON string, so leave room for its escaping. */
export const MAX_IMPORT_BODY_BYTES = 48 * 1024 * 1024;

/** What the file's z column holds: reduced levels on the site datum, or depths below the trench's surface level. */
export const zReferences = ["rl", "depth"] as const;
export const zReferenceLabels: Record<(typeof zReferences)[number], string> = {
  rl: "reduced levels (RL, m above the site datum)",
  depth: "depths below the trench's surface level (m, converted to RL)",
};

export const importPreviewSchema = z.object({
  csv: z.string().min(1, "The file is empty.").max(MAX_IMPORT_CHARS, "That file is larger than 30 MB; split it."),
  fileName: z.string().trim().max(300).default("upload.csv"),
  /** Omit to use the site's remembered mapping (or a guess from the headers). */
  mapping: importMappingSchema.optional(),
  zReference: z
    .enum(zReferences, { error: "Say whether z holds reduced levels (rl) or depths below the surface (depth)." })
    .default("rl"),
});

export const importCommitSchema = importPreviewSchema.extend({ mapping: importMappingSchema });

export type ImportPreviewInput = z.infer<typeof importPreviewSchema>;
export type ImportCommitInput = z.infer<typeof importCommitSchema>;

/** One refused row: its number as a spreadsheet shows it (the header is row 1) and every reason. */
export type ImportRowError = { row: number; reasons: string[] };
