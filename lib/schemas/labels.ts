import { z } from "zod";
import { numeric, uuid } from "./common";

/** The most labels one print holds (about a hundred sheets). */
export const MAX_LABELS = 2000;

const recordNumber = numeric(
  z
    .number({ error: "Give a record number." })
    .int("A record number is a whole number.")
    .min(1, "Numbers start at 1.")
    .max(99_999_999),
).optional();

/**
 * Which records a print of labels covers: finds, samples or boxes, narrowed by trench, context, numbers or a picked
 * list.
 */
export const labelSelection = z
  .object({
    kind: z.enum(["finds", "samples", "boxes"], { error: "Labels are for finds, samples or boxes." }).default("finds"),
    trenchId: uuid.optional(),
    contextId: uuid.optional(),
    fromNumber: recordNumber,
    toNumber: recordNumber,
    /** Ids picked in a register, comma-separated. */
    ids: z
      .string()
      .optional()
      .transform((v) =>
        v
          ? v
              .split(",")
              .map((s) => s.trim())
              .filter(Boolean)
          : undefined,
      )
      .pipe(z.array(uuid).max(MAX_LABELS, `At most ${MAX_LABELS} records at once.`).optional()),
  })
  .refine((v) => v.fromNumber === undefined || v.toNumber === undefined || v.fromNumber <= v.toNumber, {
    path: ["toNumber"],
    message: "The last number comes after the first.",
  });

export type LabelSelection = z.infer<typeof labelSelection>;
