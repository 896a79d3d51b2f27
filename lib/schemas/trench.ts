import { z } from "zod";
import { metres } from "./common";

const position = z.tuple([metres, metres]);
const ring = z.array(position).min(3, "A ring needs at least 3 vertices.");

/** A trench outline as a GeoJSON Polygon (RFC 7946 §3.1.6): first ring the edge, further rings holes. */
export const polygonSchema = z.object({
  type: z.literal("Polygon"),
  coordinates: z.array(ring).min(1, "An outline needs its outer ring."),
});

export const trenchCreateSchema = z.object({
  code: z.string().trim().min(1, "Give the trench a code.").max(20),
  name: z.string().trim().max(200).default(""),
  outline: polygonSchema,
  maxDepth: z.coerce.number().min(0).max(100).nullish(),
});

export const trenchUpdateSchema = trenchCreateSchema.partial();

export type TrenchCreate = z.infer<typeof trenchCreateSchema>;
export type TrenchUpdate = z.infer<typeof trenchUpdateSchema>;
