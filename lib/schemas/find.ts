import { z } from "zod";
import { metres, pageQuery, uuid } from "./common";

const optionalNumber = <T extends z.ZodTypeAny>(inner: T) =>
  z.preprocess((v) => (v === "" || v === undefined ? null : v), inner.nullable()).optional();

export const findCreateSchema = z.object({
  contextId: uuid,
  classId: uuid,
  x: metres,
  y: metres,
  z: optionalNumber(metres),
  count: optionalNumber(z.coerce.number().int().min(1, "A count is at least 1.").max(1_000_000)),
  weightG: optionalNumber(z.coerce.number().min(0, "A weight cannot be negative.").max(10_000_000)),
  description: z.string().trim().max(4000).default(""),
  method: z.enum(["plan", "typed", "imported"]).default("typed"),
});

export const findUpdateSchema = findCreateSchema.omit({ method: true }).partial();

export const findSortKeys = ["number", "recordedAt", "trench", "context", "class", "recorder", "x", "y", "z"] as const;

export const findListQuery = pageQuery.extend({
  trenchId: uuid.optional(),
  contextId: uuid.optional(),
  classId: uuid.optional(),
  recordedBy: uuid.optional(),
  from: z.coerce.date().optional(),
  to: z.coerce.date().optional(),
  q: z.string().trim().max(200).optional(),
  sort: z.enum(findSortKeys).default("number"),
  dir: z.enum(["asc", "desc"]).default("asc"),
});

export type FindCreate = z.infer<typeof findCreateSchema>;
export type FindUpdate = z.infer<typeof findUpdateSchema>;
export type FindListQuery = z.infer<typeof findListQuery>;
