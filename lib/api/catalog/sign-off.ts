import { z } from "zod";
import { auditQuerySchema, invitationCreateSchema, reopenSchema } from "@/lib/schemas/sign-off";
import { directorOnly, recorders, type ApiOperation } from "../operation";
import { invitationRow, sentInvitation, signOffOutcome } from "../responses";

/** API operations of sign-off, reopening, audit, invitations. */
export const signOffApi = {
  signOffQueue: {
    method: "GET",
    path: "/api/sites/{siteId}/sign-off",
    summary: "Contexts awaiting sign-off and recently signed off, with what keeps each from sign-off",
    roles: "member",
    from: "none",
  },
  contextSubmit: {
    method: "POST",
    path: "/api/sites/{siteId}/sign-off/{contextId}/submit",
    summary: "Submit a complete context sheet for sign-off (freezes it)",
    roles: recorders,
    doing: "submit contexts for sign-off",
    from: "none",
    response: signOffOutcome,
  },
  contextSignOff: {
    method: "POST",
    path: "/api/sites/{siteId}/sign-off/{contextId}/lock",
    summary: "Sign off (lock) a submitted context; the trench is signed off with its last context",
    roles: directorOnly,
    doing: "sign off contexts",
    from: "none",
    response: signOffOutcome,
  },
  contextReopen: {
    method: "POST",
    path: "/api/sites/{siteId}/sign-off/{contextId}/reopen",
    summary: "Reopen a signed-off context, or return a submitted one, with a reason (mailed to the members)",
    roles: directorOnly,
    doing: "reopen contexts",
    input: reopenSchema,
    response: signOffOutcome,
  },
  auditList: {
    method: "GET",
    path: "/api/sites/{siteId}/audit",
    summary: "The record trail, newest first, filterable by record and person",
    roles: "member",
    input: auditQuerySchema,
    from: "query",
  },
  invitationsList: {
    method: "GET",
    path: "/api/sites/{siteId}/invitations",
    summary: "Invitations sent for this site and their state",
    roles: directorOnly,
    doing: "manage members",
    from: "none",
    response: z.array(invitationRow),
  },
  invitationsCreate: {
    method: "POST",
    path: "/api/sites/{siteId}/invitations",
    summary: "Invite a person by e-mail (the link expires after 7 days)",
    roles: directorOnly,
    doing: "manage members",
    input: invitationCreateSchema,
    response: sentInvitation,
    successStatus: 201,
  },
  invitationRevoke: {
    method: "DELETE",
    path: "/api/sites/{siteId}/invitations/{invitationId}",
    summary: "Withdraw an invitation not yet accepted",
    roles: directorOnly,
    doing: "manage members",
    from: "none",
  },
} as const satisfies Record<string, ApiOperation>;
