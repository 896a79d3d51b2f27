import { z } from "zod";
import { uuid } from "./common";
import { checkProcessing, processingFields } from "./processing";

/** The most finds one bulk edit changes (a whole context's worth, several times over). */
export const MAX_BULK_FINDS = 5000;

const findIds = z
  .array(uuid)
  .min(1, "Pick at least one find.")
  .max(MAX_BULK_FINDS, `At most ${MAX_BULK_FINDS.toLocaleString("en-GB")} finds at once.`);

/** One change to many finds of the register, all or nothing. */
export const findsBulkSchema = z.discriminatedUnion(
  "action",
  [
    z
      .object({
        action: z.literal("move"),
        findIds,
        contextId: z.string().min(1, "Pick the context to move them to.").pipe(uuid),
      })
      .strict(),
    z
      .object({
        action: z.literal("reclass"),
        findIds,
        classId: z.string().min(1, "Pick the class to give them.").pipe(uuid),
      })
      .strict(),
    z
      .object({
        action: z.literal("delete"),
        findIds,
        reason: z
          .string()
          .trim()
          .min(3, "Say why the finds are deleted.")
          .max(500, "A reason is at most 500 characters."),
      })
      .strict(),
    // After the trench: washed, marked, bagged, boxed, sent out, returned; and where they are kept.
    z
      .object({ action: z.literal("process"), findIds, ...processingFields })
      .strict()
      .superRefine(checkProcessing),
  ],
  { error: "Choose what to do: move, reclass, delete or process." },
);

export type FindsBulk = z.infer<typeof findsBulkSchema>;
