import { z } from "zod";

/** Symbol shapes Loamwork draws on the plan; each class pairs a colour with one of them. */
export const symbolShapes = ["disc", "square", "triangle", "diamond", "cross", "star", "ring", "bar"] as const;

export const artefactClassCreateSchema = z.object({
  code: z.string().trim().min(1).max(20).regex(/^[A-Za-z0-9_-]+$/, "Use letters, digits, - and _ only."),
  label: z.string().trim().min(1, "Give the class a label.").max(200),
  material: z.string().trim().max(200).default(""),
  colour: z.string().regex(/^#[0-9a-fA-F]{6}$/, "A colour is written #rrggbb."),
  symbol: z.enum(symbolShapes),
  humanRemains: z.boolean().default(false),
});

export const artefactClassUpdateSchema = artefactClassCreateSchema.partial();
