import { z } from "zod";
import { numeric, uuid } from "./common";
import { polygonSchema } from "./trench";

export const contextTypes = ["layer", "fill", "cut", "structure", "deposit"] as const;

const sheetText = (max = 2000) => z.string().trim().max(max);

/** The sheet's fields without defaults: an update names only what it changes. */
const sheetFields = {
  number: numeric(z.number({ error: "Enter a context number." }).int("A context number is a whole number.").min(1).max(9_999_999)),
  type: z.enum(contextTypes, { error: "Pick layer, fill, cut, structure or deposit." }),
  colour: sheetText(200),
  compaction: sheetText(200),
  composition: sheetText(),
  inclusions: sheetText(),
  description: sheetText(8000),
  interpretation: sheetText(8000),
  extent: polygonSchema.nullish(),
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
});

/** No defaults here: a field left out stays as it is. */
export const contextUpdateSchema = z.object(sheetFields).partial();

export type ContextCreate = z.infer<typeof contextCreateSchema>;
export type ContextUpdate = z.infer<typeof contextUpdateSchema>;
