import { z } from "zod";
import { numeric, pageQuery, uuid } from "./common";

/** Plans and sections drawn on film or paper, with the words the register shows. */
export const drawingKinds = ["plan", "section"] as const;
export type DrawingKind = (typeof drawingKinds)[number];
export const drawingKindLabels: Record<DrawingKind, string> = { plan: "Plan", section: "Section" };

/** The scales a field drawing is usually made at (common practice); any whole 1:n from 1:1 to 1:1000 is accepted. */
export const commonScales = [10, 20, 50, 100] as const;

const blankIsNull = <T extends z.ZodType>(inner: T) => z.preprocess((v) => (v === "" ? null : v), inner.nullish());
const isoDay = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Give the date as YYYY-MM-DD.")
  .refine((v) => !Number.isNaN(Date.parse(v)), "That date does not exist.");

/** The drawing sheet's fields without defaults: an update names only what it changes. */
const drawingFields = {
  kind: z.enum(drawingKinds, { error: "Pick plan or section." }),
  /** The scale's denominator: 20 is 1:20. */
  scale: numeric(
    z
      .number({ error: "Enter the scale as the n of 1:n, e.g. 20." })
      .int("The scale is 1 to a whole number, e.g. 1:20.")
      .min(1, "The scale is at least 1:1.")
      .max(1000, "The scale is at most 1:1000."),
  ),
  contextIds: z
    .array(uuid, { error: "Pick the contexts the drawing shows." })
    .min(1, "Pick at least one context the drawing shows.")
    .max(200, "A drawing shows at most 200 contexts."),
  title: z.string().trim().max(500, "The title is at most 500 characters."),
  drawnBy: blankIsNull(uuid),
  drawnOn: isoDay,
};

export const drawingCreateSchema = z
  .object({ ...drawingFields, title: drawingFields.title.default(""), drawnOn: drawingFields.drawnOn.optional() })
  .strict();

/** No defaults here: a field left out stays as it is. */
export const drawingUpdateSchema = z.object(drawingFields).partial().strict();

/** Deleting a drawing needs a reason: its number is never handed out again. */
export const drawingDeleteSchema = z
  .object({
    reason: z.string().trim().min(3, "Say why the drawing is deleted.").max(500, "A reason is at most 500 characters."),
  })
  .strict();

export const drawingListQuery = pageQuery.extend({
  trenchId: uuid.optional(),
  contextId: uuid.optional(),
  kind: z.enum(drawingKinds, { error: "Pick plan or section." }).optional(),
});
export const exportDrawingsQuery = drawingListQuery.omit({ page: true, pageSize: true });

export type DrawingCreate = z.infer<typeof drawingCreateSchema>;
export type DrawingUpdate = z.infer<typeof drawingUpdateSchema>;
export type DrawingListQuery = z.infer<typeof drawingListQuery>;
