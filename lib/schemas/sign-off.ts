import { z } from "zod";
import "./messages";
import { roleSchema, uuid } from "./common";

/** A reopening or return needs a reason someone can read later in the record trail. */
export const reopenSchema = z.object({
  reason: z.string().trim().min(10, "Give the reason in a sentence (at least 10 characters).").max(4000),
});

export const invitationCreateSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter an e-mail address."),
  role: roleSchema,
});

/** Filters of the record trail; all optional, combined with "and". */
export const auditQuerySchema = z.object({
  recordType: z
    .enum(["site", "member", "trench", "context", "relation", "find", "class", "photo", "run", "import"])
    .optional(),
  recordId: z.string().trim().min(1).max(100).optional(),
  actorId: uuid.optional(),
  limit: z.coerce.number().int().min(1).max(1000).default(200),
});
