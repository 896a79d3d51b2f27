import { z } from "zod";
import "./messages";
import { numeric, uuid } from "./common";
import { polygonSchema } from "./trench";

export const contextTypes = ["layer", "fill", "cut", "structure", "deposit"] as const;

const sheetText = (max = 2000) => z.string().trim().max(max);
/** A field a form may leave blank: blank is "not recorded" (null), never 0. */
const blankIsNull = <T extends z.ZodType>(inner: T) => z.preprocess((v) => (v === "" ? null : v), inner.nullish());
const measure = (what: string) =>
  blankIsNull(
    numeric(
      z
        .number({ error: `Enter the ${what} in metres.` })
        .min(0, `The ${what} cannot be negative.`)
        .max(1000, `A ${what} over 1000 m is not a context.`),
    ),
  );
const day = blankIsNull(z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Give the date as YYYY-MM-DD."));
export const digMethods = ["trowel", "mattock", "machine", "sieved"] as const;

/** The sheet's fields without defaults: an update names only what it changes. */
const sheetFields = {
  number: numeric(
    z
      .number({ error: "Enter a context number." })
      .int("A context number is a whole number.")
      .min(1, "A context number starts at 1.")
      .max(9_999_999, "A context number goes up to 9,999,999."),
  ),
  type: z.enum(contextTypes, { error: "Pick layer, fill, cut, structure or deposit." }),
  colour: sheetText(200),
  compaction: sheetText(200),
  composition: sheetText(),
  inclusions: sheetText(),
  description: sheetText(8000),
  interpretation: sheetText(8000),
  extent: polygonSchema.nullish(),
  lengthM: measure("length"),
  widthM: measure("width"),
  thicknessM: measure("thickness"),
  excavatedBy: sheetText(200),
  openedOn: day,
  closedOn: day,
  digMethod: blankIsNull(z.enum(digMethods, { error: "Pick trowel, mattock, machine or sieved." })),
  sieveMeshMm: blankIsNull(
    numeric(
      z
        .number({ error: "Enter the mesh size in millimetres." })
        .positive("A mesh size is more than 0 mm.")
        .max(100, "A mesh over 100 mm is not a sieve."),
    ),
  ),
};

export const contextCreateSchema = z.object({
  trenchId: uuid,
  ...sheetFields,
  colour: sheetFields.colour.default(""),
  compaction: sheetFields.compaction.default(""),
  composition: sheetFields.composition.default(""),
  inclusions: sheetFields.inclusions.default(""),
  description: sheetFields.description.default(""),
  interpretation: sheetFields.interpretation.default(""),
  excavatedBy: sheetFields.excavatedBy.default(""),
});

/** No defaults here: a field left out stays as it is. */
export const contextUpdateSchema = z.object(sheetFields).partial();

export type ContextCreate = z.infer<typeof contextCreateSchema>;
export type ContextUpdate = z.infer<typeof contextUpdateSchema>;
