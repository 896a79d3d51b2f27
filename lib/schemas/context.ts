import { z } from "zod";
import { uuid } from "./common";
import { polygonSchema } from "./trench";

export const contextTypes = ["layer", "fill", "cut", "structure", "deposit"] as const;

const sheetText = (max = 2000) => z.string().trim().max(max).default("");

export const contextCreateSchema = z.object({
  trenchId: uuid,
  number: z.coerce.number().int("A context number is a whole number.").min(1).max(9_999_999),
  type: z.enum(contextTypes, { error: "Pick layer, fill, cut, structure or deposit." }),
  colour: sheetText(200),
  compaction: sheetText(200),
  composition: sheetText(),
  inclusions: sheetText(),
  description: sheetText(8000),
  interpretation: sheetText(8000),
  extent: polygonSchema.nullish(),
});

export const contextUpdateSchema = contextCreateSchema.omit({ trenchId: true }).partial();

export type ContextCreate = z.infer<typeof contextCreateSchema>;
export type ContextUpdate = z.infer<typeof contextUpdateSchema>;
