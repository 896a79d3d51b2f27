"use server";

import { getDb } from "@/db/client";
import { toFailure } from "@/lib/server/guard";
import { confirmPasswordReset, requestPasswordReset, resetConfirmSchema, resetRequestSchema } from "@/lib/server/password-reset";

export type ResetState = { error?: string; fieldErrors?: Record<string, string[]>; done?: boolean };

export async function requestResetAction(_prev: ResetState, form: FormData): Promise<ResetState> {
  const parsed = resetRequestSchema.safeParse({ email: form.get("email") });
  if (!parsed.success) return toFailure(parsed.error);
  try {
    await requestPasswordReset(await getDb(), parsed.data.email);
  } catch (err) {
    return toFailure(err);
  }
  return { done: true };
}

export async function confirmResetAction(_prev: ResetState, form: FormData): Promise<ResetState> {
  const parsed = resetConfirmSchema.safeParse({ token: form.get("token"), password: form.get("password") });
  if (!parsed.success) return toFailure(parsed.error);
  if (form.get("password") !== form.get("again")) return { error: "The two passwords differ.", fieldErrors: { again: ["Type the same password twice."] } };
  try {
    await confirmPasswordReset(await getDb(), parsed.data);
  } catch (err) {
    return toFailure(err);
  }
  return { done: true };
}
