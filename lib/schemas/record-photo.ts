import { z } from "zod";
import { numeric, pageQuery, uuid } from "./common";

/**
 * The photo register's entries: record photos of a context, a find or a trench (plan underlays are fitted
 * photos of the plan and live apart, lib/geometry/photo-fit-input.ts).
 */
export const photoSubjects = ["context", "find", "trench"] as const;
export type PhotoSubject = (typeof photoSubjects)[number];

/** Facing as the eight compass points a photographer calls out; any whole degree is kept as given. */
export const compassPoints = [
  ["N", 0],
  ["NE", 45],
  ["E", 90],
  ["SE", 135],
  ["S", 180],
  ["SW", 225],
  ["W", 270],
  ["NW", 315],
] as const;

/** "N", "SW", or "35°" for a bearing between the points; "not stated" for none. */
export function facingWords(degrees: number | null | undefined): string {
  if (degrees === null || degrees === undefined) return "not stated";
  const point = compassPoints.find(([, d]) => d === degrees);
  return point ? point[0] : `${degrees}°`;
}

/** Scales usually laid in a record photo (common practice), offered on the form; any short text is kept. */
export const commonPhotoScales = ["none", "10 cm", "20 cm", "50 cm", "1 m", "2 m"] as const;

const blankIsNull = <T extends z.ZodType>(inner: T) => z.preprocess((v) => (v === "" ? null : v), inner.nullish());

/** A compass point ("NE") or whole degrees clockwise from grid north (0–359). */
const facing = blankIsNull(
  z.preprocess(
    (v) => {
      if (typeof v !== "string") return v;
      const point = compassPoints.find(([p]) => p === v.trim().toUpperCase());
      return point ? point[1] : v;
    },
    numeric(
      z
        .number({ error: "Give the facing as a compass point (N, NE, …) or degrees from grid north." })
        .int("Give the facing in whole degrees.")
        .min(0, "The facing is 0 to 359 degrees from grid north.")
        .max(359, "The facing is 0 to 359 degrees from grid north."),
    ),
  ),
);

/** The sheet's fields without defaults: an update names only what it changes. */
const photoFields = {
  facing,
  scale: z
    .string({ error: "Say which scale shows in the photo, or none." })
    .trim()
    .min(1, "Say which scale shows in the photo, or none.")
    .max(40, "The scale is at most 40 characters."),
  caption: z.string().trim().max(1000, "The caption is at most 1,000 characters."),
  takenBy: blankIsNull(uuid),
};

/** What the upload carries beside the file: what the photo is of, and its sheet. */
export const recordPhotoUploadSchema = z
  .object({
    siteId: uuid,
    subject: z.enum(photoSubjects, { error: "Say whether the photo is of a context, a find or a trench." }),
    subjectId: uuid,
    ...photoFields,
    caption: photoFields.caption.default(""),
  })
  .strict();

/** No defaults here: a field left out stays as it is. */
export const recordPhotoUpdateSchema = z.object(photoFields).partial().strict();

/** Deleting a record photo needs a reason: its number is never handed out again. */
export const recordPhotoDeleteSchema = z
  .object({
    reason: z.string().trim().min(3, "Say why the photo is deleted.").max(500, "A reason is at most 500 characters."),
  })
  .strict();

export const recordPhotoListQuery = pageQuery.extend({
  trenchId: uuid.optional(),
  contextId: uuid.optional(),
  findId: uuid.optional(),
});

export type RecordPhotoUpload = z.infer<typeof recordPhotoUploadSchema>;
export type RecordPhotoUpdate = z.infer<typeof recordPhotoUpdateSchema>;
export type RecordPhotoListQuery = z.infer<typeof recordPhotoListQuery>;
