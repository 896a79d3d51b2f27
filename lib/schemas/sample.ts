import { z } from "zod";
import { REDUCED_LEVEL_WORDS, metres, numeric, pageQuery, uuid } from "./common";

/** The trade's kinds of sample, with the words the register shows. */
export const sampleTypes = [
  "bulk",
  "spot",
  "charcoal",
  "monolith",
  "micromorphology",
  "pollen",
  "luminescence",
  "other",
] as const;
export type SampleType = (typeof sampleTypes)[number];
export const sampleTypeLabels: Record<SampleType, string> = {
  bulk: "Bulk soil (flotation, sieving)",
  spot: "Spot sample",
  charcoal: "Charcoal for dating",
  monolith: "Monolith",
  micromorphology: "Micromorphology block",
  pollen: "Pollen",
  luminescence: "Luminescence dating (OSL)",
  other: "Other",
};

/** Where a sample stands once out of the ground: post-excavation care, changed in bulk, not locked with the context. */
export const sampleStatuses = ["taken", "processing", "processed", "sent", "discarded"] as const;
export type SampleStatus = (typeof sampleStatuses)[number];
export const sampleStatusLabels: Record<SampleStatus, string> = {
  taken: "Taken, awaiting processing",
  processing: "Being processed",
  processed: "Processed",
  sent: "Sent to a specialist",
  discarded: "Discarded after processing",
};

/** A field a form may leave blank: blank is "not recorded" (null), never 0. */
const blankIsNull = <T extends z.ZodType>(inner: T) => z.preprocess((v) => (v === "" ? null : v), inner.nullish());
const isoDay = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Give the date as YYYY-MM-DD.")
  .refine((v) => !Number.isNaN(Date.parse(v)), "That date does not exist.");

/** The sample sheet's fields without defaults: an update names only what it changes. */
const sampleFields = {
  contextId: z.string().min(1, "Pick the context it was taken from.").pipe(uuid),
  /** The spit's number within the context (spits are numbered from 1 at the top); blank = not taken by spit. */
  spit: blankIsNull(
    numeric(
      z
        .number({ error: "Enter the spit number." })
        .int("A spit number is a whole number.")
        .min(1, "Spits are numbered from 1 at the top.")
        .max(999),
    ),
  ),
  type: z.enum(sampleTypes, { error: `Pick the kind of sample: ${sampleTypes.join(", ")}.` }),
  x: blankIsNull(metres),
  y: blankIsNull(metres),
  z: blankIsNull(metres).describe(REDUCED_LEVEL_WORDS),
  volumeL: blankIsNull(
    numeric(
      z
        .number({ error: "Enter the volume in litres." })
        .positive("A volume is more than 0 litres.")
        .max(2000, "A sample over 2,000 litres is a spoil heap, not a sample."),
    ),
  ),
  purpose: z.string().trim().max(2000, "The purpose is at most 2,000 characters."),
  takenBy: blankIsNull(uuid),
  takenOn: isoDay,
};

/** Both coordinates or neither: a sample's position is a point on the site grid. */
const bothOrNeither = (v: { x?: number | null; y?: number | null }, ctx: z.RefinementCtx) => {
  const hasX = v.x !== undefined && v.x !== null;
  const hasY = v.y !== undefined && v.y !== null;
  if (v.x !== undefined && v.y !== undefined && hasX !== hasY)
    ctx.addIssue({ code: "custom", path: [hasX ? "y" : "x"], message: "Give both x and y, or neither." });
};

export const sampleCreateSchema = z
  .object({ ...sampleFields, purpose: sampleFields.purpose.default(""), takenOn: sampleFields.takenOn.optional() })
  .strict()
  .superRefine((v, ctx) => bothOrNeither({ x: v.x ?? null, y: v.y ?? null }, ctx));

/** No defaults here: a field left out stays as it is. */
export const sampleUpdateSchema = z.object(sampleFields).partial().strict();

/** Deleting a sample needs a reason: its number is never handed out again and the register says why it is gone. */
export const sampleDeleteSchema = z
  .object({
    reason: z.string().trim().min(3, "Say why the sample is deleted.").max(500, "A reason is at most 500 characters."),
  })
  .strict();

/** Post-excavation: a status for one or many samples at once, all or nothing. */
export const sampleStatusSchema = z
  .object({
    sampleIds: z.array(uuid).min(1, "Pick at least one sample.").max(5000, "At most 5,000 samples at once."),
    status: z.enum(sampleStatuses, { error: `Pick a status: ${sampleStatuses.join(", ")}.` }),
  })
  .strict();

export const sampleListQuery = pageQuery.extend({
  trenchId: uuid.optional(),
  contextId: uuid.optional(),
  type: z.enum(sampleTypes).optional(),
  status: z.enum(sampleStatuses).optional(),
});

export const exportSamplesQuery = sampleListQuery.omit({ page: true, pageSize: true });

export type SampleCreate = z.infer<typeof sampleCreateSchema>;
export type SampleUpdate = z.infer<typeof sampleUpdateSchema>;
export type SampleListQuery = z.infer<typeof sampleListQuery>;
