import { invitationAcceptSchema, resetConfirmSchema, resetRequestSchema } from "@/lib/schemas/account";
import type { ApiOperation } from "../operation";

/**
 * The entries used before sign-in. They carry no site role: each proves its right with a single-use token
 * (or, for a reset request, answers the same whether or not the address has an account).
 */
export const publicApi = {
  passwordResetRequest: {
    method: "POST",
    path: "/api/auth-extra/password-reset/request",
    summary: "Mail a password-reset link (same answer for unknown addresses)",
    public: true,
    input: resetRequestSchema,
  },
  passwordResetConfirm: {
    method: "POST",
    path: "/api/auth-extra/password-reset/confirm",
    summary: "Set a new password with a mailed reset token",
    public: true,
    input: resetConfirmSchema,
  },
  invitationAccept: {
    method: "POST",
    path: "/api/auth-extra/invitations/accept",
    summary: "Join a site with a mailed invitation token",
    public: true,
    input: invitationAcceptSchema,
  },
} as const satisfies Record<string, ApiOperation>;
