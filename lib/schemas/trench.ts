import { z } from "zod";
import "./messages";
import { formatLimit, MAX_HOLES, MAX_RING_VERTICES } from "@/lib/spatial/geometry/limits";
import { metres, numeric } from "./common";
import { squareGridFields } from "./squares";

const position = z.tuple([metres, metres]);
/** GeoJSON repeats the first vertex at the end of a ring; that closing vertex is not counted. */
const ring = z
  .array(position)
  .min(3, "A ring needs at least 3 vertices.")
  .max(
    MAX_RING_VERTICES + 1,
    `A ring may have at most ${formatLimit(MAX_RING_VERTICES)} vertices; draw it with fewer.`,
  );

/** A trench outline as a GeoJSON Polygon (RFC 7946 §3.1.6): first ring the edge, further rings holes. */
export const polygonSchema = z.object({
  type: z.literal("Polygon"),
  coordinates: z
    .array(ring)
    .min(1, "An outline needs its outer ring.")
    .max(MAX_HOLES + 1, `An outline may have at most ${formatLimit(MAX_HOLES)} holes.`),
});

const trenchFields = {
  code: z.string().trim().min(1, "Give the trench a code.").max(20),
  name: z.string().trim().max(200),
  outline: polygonSchema,
  /** Ground-surface reduced level before digging (metres against the site's datum); depths are measured from it. */
  surfaceLevel: numeric(
    z
      .number({ error: "Enter the ground-surface level in metres." })
      .refine(Number.isFinite)
      .refine((v) => Math.abs(v) < 10_000, "A reduced level beyond ±10 km is not on this planet's surface."),
  ).nullish(),
};

export const trenchCreateSchema = z.object({ ...trenchFields, name: trenchFields.name.default("") });

/** No defaults here: a field left out stays as it is. The square grid (issue 16) is set on an existing trench. */
export const trenchUpdateSchema = z.object({ ...trenchFields, ...squareGridFields }).partial();

export type TrenchCreate = z.infer<typeof trenchCreateSchema>;
export type TrenchUpdate = z.infer<typeof trenchUpdateSchema>;
