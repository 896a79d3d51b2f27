import { z } from "zod";
import "./messages";

/** Symbol shapes Loamwork draws on the plan; each class pairs a colour with one of them. */
export const symbolShapes = ["disc", "square", "triangle", "diamond", "cross", "star", "ring", "bar"] as const;

const classFields = {
  code: z
    .string()
    .trim()
    .min(1)
    .max(20)
    .regex(/^[A-Za-z0-9_-]+$/, "Use letters, digits, - and _ only."),
  label: z.string().trim().min(1, "Give the class a label.").max(200),
  material: z.string().trim().max(200),
  colour: z.string().regex(/^#[0-9a-fA-F]{6}$/, "A colour is written #rrggbb."),
  symbol: z.enum(symbolShapes),
  humanRemains: z.boolean(),
};

export const artefactClassCreateSchema = z.object({
  ...classFields,
  material: classFields.material.default(""),
  humanRemains: classFields.humanRemains.default(false),
});

/** No defaults here: a field left out stays as it is. */
export const artefactClassUpdateSchema = z.object(classFields).partial();
