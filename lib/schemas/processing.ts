import { z } from "zod";
import { numeric, pageQuery, uuid } from "./common";

/**
 * Where a find stands after it left the ground. A find may be sent to a specialist and come back
 * ("returned"); each change is on its audit trail, so the whole journey can be read back.
 */
export const findProcessingStates = ["lifted", "washed", "marked", "bagged", "boxed", "sent", "returned"] as const;
export type FindProcessing = (typeof findProcessingStates)[number];
export const findProcessingLabels: Record<FindProcessing, string> = {
  lifted: "Lifted, not yet processed",
  washed: "Washed",
  marked: "Marked",
  bagged: "Bagged",
  boxed: "Boxed",
  sent: "With a specialist",
  returned: "Back from the specialist",
};

const sentTo = z.string().trim().max(200, "Who it was sent to is at most 200 characters.");
const location = z.string().trim().max(200, "The location is at most 200 characters.");
/** A box, or null to take the records out of their box. */
const boxChoice = z.union([z.string().min(1, "Pick a box.").pipe(uuid), z.null()]);

/**
 * The after-the-trench fields one bulk change may set: at least one of them. Sending a find out names who
 * it goes to.
 */
export const processingFields = {
  processing: z.enum(findProcessingStates, { error: `Pick a state: ${findProcessingStates.join(", ")}.` }).optional(),
  sentTo: sentTo.optional(),
  boxId: boxChoice.optional(),
  location: location.optional(),
};

export function checkProcessing(
  v: { processing?: FindProcessing; sentTo?: string; boxId?: string | null; location?: string },
  ctx: z.RefinementCtx,
) {
  if (v.processing === undefined && v.boxId === undefined && v.location === undefined && v.sentTo === undefined)
    ctx.addIssue({
      code: "custom",
      path: ["processing"],
      message: "Say what changed: the state, the box or the location.",
    });
  if (v.processing === "sent" && !v.sentTo)
    ctx.addIssue({ code: "custom", path: ["sentTo"], message: "Name the specialist or laboratory it goes to." });
}

/** Samples into a box (or out of it, with null), or to a place in the store. */
export const samplesStoreSchema = z
  .object({
    sampleIds: z.array(uuid).min(1, "Pick at least one sample.").max(5000, "At most 5,000 samples at once."),
    boxId: boxChoice.optional(),
    location: location.optional(),
  })
  .strict()
  .refine((v) => v.boxId !== undefined || v.location !== undefined, {
    path: ["boxId"],
    message: "Pick a box, or give a location.",
  });
export type SamplesStore = z.infer<typeof samplesStoreSchema>;

const boxNumber = numeric(
  z
    .number({ error: "Enter the box number." })
    .int("A box number is a whole number.")
    .min(1, "Box numbers start at 1.")
    .max(999_999, "A box number is at most 999999."),
);
const boxFields = {
  number: boxNumber,
  store: z.string().trim().max(200, "The store is at most 200 characters."),
  note: z.string().trim().max(1000, "A note is at most 1,000 characters."),
};

/** A new box: its number is the next free one unless given. */
export const boxCreateSchema = z
  .object({ number: boxNumber.optional(), store: boxFields.store.default(""), note: boxFields.note.default("") })
  .strict();
/** No defaults here: a field left out stays as it is. */
export const boxUpdateSchema = z.object(boxFields).partial().strict();
export const boxListQuery = pageQuery.extend({ store: z.string().trim().max(200).optional() });
/** Everything in a box moved into another box of the site. */
export const boxEmptySchema = z
  .object({
    intoBoxId: z
      .string({ error: "Pick the box to empty it into." })
      .min(1, "Pick the box to empty it into.")
      .pipe(uuid),
  })
  .strict();

export type BoxCreate = z.infer<typeof boxCreateSchema>;
export type BoxUpdate = z.infer<typeof boxUpdateSchema>;
export type BoxListQuery = z.infer<typeof boxListQuery>;
export type BoxEmpty = z.infer<typeof boxEmptySchema>;
