import { z } from "zod";
import { roleSchema, uuid } from "@/lib/schemas/common";
import { directorOnly, recorders, type ApiOperation } from "./types";

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
  recordType: z.enum(["site", "member", "trench", "context", "relation", "find", "class", "photo", "run", "import"]).optional(),
  recordId: z.string().trim().min(1).max(100).optional(),
  actorId: uuid.optional(),
  limit: z.coerce.number().int().min(1).max(1000).default(200),
});

/** API operations of sign-off, reopening, audit, invitations. */
export const signOffApi = {
  signOffQueue: { method: "GET", path: "/api/sites/{siteId}/sign-off", summary: "Contexts awaiting sign-off and recently signed off, with what keeps each from sign-off", roles: "member", from: "none" },
  contextSubmit: { method: "POST", path: "/api/sites/{siteId}/sign-off/{contextId}/submit", summary: "Submit a complete context sheet for sign-off (freezes it)", roles: recorders, doing: "submit contexts for sign-off", from: "none" },
  contextSignOff: { method: "POST", path: "/api/sites/{siteId}/sign-off/{contextId}/lock", summary: "Sign off (lock) a submitted context; the trench is signed off with its last context", roles: directorOnly, doing: "sign off contexts", from: "none" },
  contextReopen: { method: "POST", path: "/api/sites/{siteId}/sign-off/{contextId}/reopen", summary: "Reopen a signed-off context, or return a submitted one, with a reason (mailed to the members)", roles: directorOnly, doing: "reopen contexts", input: reopenSchema },
  auditList: { method: "GET", path: "/api/sites/{siteId}/audit", summary: "The record trail, newest first, filterable by record and person", roles: "member", input: auditQuerySchema, from: "query" },
  invitationsList: { method: "GET", path: "/api/sites/{siteId}/invitations", summary: "Invitations sent for this site and their state", roles: directorOnly, doing: "manage members", from: "none" },
  invitationsCreate: { method: "POST", path: "/api/sites/{siteId}/invitations", summary: "Invite a person by e-mail (the link expires after 7 days)", roles: directorOnly, doing: "manage members", input: invitationCreateSchema, successStatus: 201 },
  invitationRevoke: { method: "DELETE", path: "/api/sites/{siteId}/invitations/{invitationId}", summary: "Withdraw an invitation not yet accepted", roles: directorOnly, doing: "manage members", from: "none" },
} satisfies Record<string, ApiOperation>;
