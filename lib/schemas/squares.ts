import { z } from "zod";
import { metres, numeric, uuid } from "./common";

/**
 * Bulk finds counted by grid square (issue 16). A square sample is one square dug in one context (and spit);
 * its counts are per artefact class. No sample = the square was not excavated there; a count of 0 is a
 * count entered on purpose. No schema here carries a default beyond the create's.
 */

/** Square side: from 10 cm (a sieving sub-square) to 10 m. */
export const squareSize = numeric(
  z
    .number({ error: "Enter the square size in metres." })
    .refine(Number.isFinite, "Enter a finite size.")
    .min(0.1, "Squares are at least 0.1 m.")
    .max(10, "Squares are at most 10 m."),
);

/** A trench's grid, as the trench update names it (director only: field-rights.ts). Null clears it. */
export const squareGridFields = {
  squareSize: squareSize.nullable(),
  squareOriginX: metres.nullable(),
  squareOriginY: metres.nullable(),
};

const gridIndex = (what: string) =>
  numeric(
    z
      .number({ error: `Give the square's ${what}.` })
      .int(`A square's ${what} is a whole number.`)
      .min(-100_000)
      .max(100_000),
  );

export const MAX_SQUARE_COUNT = 10_000_000;

export const squareCountSchema = z
  .object({
    classId: z.string().min(1, "Pick the class counted.").pipe(uuid),
    count: numeric(
      z
        .number({ error: "Enter a count (0 when none were found)." })
        .int("A count is a whole number.")
        .min(0, "A count cannot be negative.")
        .max(MAX_SQUARE_COUNT, "A count is at most 10,000,000."),
    ),
    weightG: numeric(
      z
        .number({ error: "Enter a weight in grams." })
        .min(0, "A weight cannot be negative.")
        .max(10_000_000, "A weight is at most 10,000,000 g."),
    )
      .nullable()
      .optional()
      .transform((v) => v ?? null),
  })
  .strict();

/** Records one square in one context (and spit): creates it, or replaces what that square held there. */
export const squareSampleSchema = z
  .object({
    col: gridIndex("column"),
    row: gridIndex("row"),
    contextId: z.string().min(1, "Pick the context dug.").pipe(uuid),
    spitId: uuid
      .nullable()
      .optional()
      .transform((v) => v ?? null),
    /** m² of the square dug in this context or spit; omitted or null = the whole square inside the trench. */
    excavatedArea: numeric(
      z
        .number({ error: "Enter the area dug in m²." })
        .refine(Number.isFinite)
        .gt(0, "An excavated area is more than 0 m²; delete the square's record if it was not dug."),
    )
      .nullable()
      .optional()
      .transform((v) => v ?? null),
    counts: z
      .array(squareCountSchema)
      .min(1, "Enter at least one count (0 when none were found).")
      .max(200)
      .refine((cs) => new Set(cs.map((c) => c.classId)).size === cs.length, "Each class is counted once per square."),
  })
  .strict();

export type SquareSampleInput = z.infer<typeof squareSampleSchema>;

/** The square-count CSV: one row per square × context × spit × class. */
export const squareImportFields = [
  "square",
  "contextNumber",
  "spitNumber",
  "classCode",
  "count",
  "weightG",
  "excavatedArea",
] as const;
export type SquareImportField = (typeof squareImportFields)[number];

export const squareImportSchema = z
  .object({
    trenchId: z.string().min(1, "Pick the trench.").pipe(uuid),
    csv: z.string().min(1, "The file is empty.").max(5_000_000, "That file is larger than 5 MB; split it."),
    fileName: z.string().trim().max(300).default("squares.csv"),
    /** True: check every row and report, write nothing. */
    dryRun: z.boolean().default(false),
  })
  .strict();
export type SquareImportInput = z.infer<typeof squareImportSchema>;
