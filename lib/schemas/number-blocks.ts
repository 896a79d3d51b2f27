import { z } from "zod";
import { uuid } from "./common";

/** The sequences a device can reserve numbers of: finds (and samples sharing them) and contexts. */
export const numberKinds = ["find", "context"] as const;
const kind = z.enum(numberKinds, { error: 'Say which numbers: "find" or "context".' });

/** Reserving a block: which numbers, and the device that will hold them (or the Loamwork-Device header). */
export const numberBlockCreateSchema = z.object({
  kind,
  deviceId: uuid.optional(),
  deviceLabel: z.string().trim().max(100, "A device label is at most 100 characters.").optional(),
});

/** Giving a block back: its unused numbers become void, with this reason. */
export const numberBlockReleaseSchema = z.object({
  reason: z
    .string()
    .trim()
    .min(3, "Say why the numbers are given back (e.g. end of season, tablet lost).")
    .max(500, "A reason is at most 500 characters."),
});

export const numberBlockListQuery = z.object({ kind: kind.optional() });

export const numberAccountingQuery = z.object({ kind: kind.default("find") });

/** An operation a device threw away after the server refused it: recorded on the audit trail. */
export const discardSchema = z.object({
  idempotencyKey: uuid,
  operation: z.string().trim().min(1, "Name the operation.").max(100),
  method: z.enum(["POST", "PATCH", "DELETE"], { error: "The method of the discarded write: POST, PATCH or DELETE." }),
  path: z
    .string()
    .trim()
    .min(1)
    .max(500)
    .regex(/^\/api\//, "The path of the discarded write, starting /api/."),
  reasonCode: z.string().trim().max(50),
  reason: z.string().trim().max(2000),
  note: z.string().trim().max(2000).optional(),
  deviceId: uuid.optional(),
  /** What the operation would have written, kept on the audit trail so nothing is lost unseen. */
  body: z.unknown().optional(),
});

export type NumberBlockCreate = z.infer<typeof numberBlockCreateSchema>;
export type NumberBlockRelease = z.infer<typeof numberBlockReleaseSchema>;
export type NumberAccountingQuery = z.infer<typeof numberAccountingQuery>;
export type Discard = z.infer<typeof discardSchema>;
