"use server";

import { badInput } from "@/lib/server/errors";
import { runPublic } from "@/lib/server/guard";
import {
  confirmPasswordReset,
  requestPasswordReset,
  resetConfirmSchema,
  resetRequestSchema,
} from "@/lib/server/password-reset";

export type ResetState = { error?: string; fieldErrors?: Record<string, string[]>; done?: boolean };

/** Through the same public entry as the API route: parsed by the same schema, errors mapped the same way. */
export async function requestResetAction(_prev: ResetState, form: FormData): Promise<ResetState> {
  const out = await runPublic(resetRequestSchema, { email: form.get("email") }, (ctx) =>
    requestPasswordReset(ctx.db, ctx.input.email),
  );
  return out.ok ? { done: true } : { error: out.error, fieldErrors: out.fieldErrors };
}

export async function confirmResetAction(_prev: ResetState, form: FormData): Promise<ResetState> {
  const out = await runPublic(
    resetConfirmSchema,
    { token: form.get("token"), password: form.get("password") },
    (ctx) => {
      if (form.get("password") !== form.get("again"))
        throw badInput("The two passwords differ.", { again: ["Type the same password twice."] });
      return confirmPasswordReset(ctx.db, ctx.input);
    },
  );
  return out.ok ? { done: true } : { error: out.error, fieldErrors: out.fieldErrors };
}
