import { z } from "zod";
import "./messages";

/** A new password: long enough to resist guessing, short enough to type with cold hands. */
export const newPasswordSchema = z.string().min(10, "Choose a password of at least 10 characters.").max(200);

export const invitationAcceptSchema = z.object({
  token: z.string().min(20, "That invitation link is incomplete."),
  name: z.string().trim().min(1, "Give your name as it should appear on the record.").max(200).optional(),
  password: z.string().min(1, "Enter a password."),
});
export type InvitationAccept = z.infer<typeof invitationAcceptSchema>;

export const resetRequestSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter the e-mail address of your account."),
});
export const resetConfirmSchema = z.object({
  token: z.string().min(20, "That reset link is incomplete."),
  password: newPasswordSchema,
});
