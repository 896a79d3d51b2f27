"use server";

import { AuthError } from "next-auth";
import { signIn } from "@/auth";
import { runPublic } from "@/lib/server/guard";
import { acceptInvitation, invitationAcceptSchema } from "@/lib/server/invitations";

export type AcceptState = { error?: string; fieldErrors?: Record<string, string[]> };

/** Accepts the invitation, then signs the person in and opens the site they joined. */
export async function acceptAction(_prev: AcceptState, form: FormData): Promise<AcceptState> {
  const raw = { token: form.get("token"), name: form.get("name") || undefined, password: form.get("password") };
  // Through the same public entry as the API route: parsed by the same schema, errors mapped the same way.
  const out = await runPublic(invitationAcceptSchema, raw, async (ctx) => ({
    joined: await acceptInvitation(ctx.db, ctx.input),
    password: ctx.input.password,
  }));
  if (!out.ok) return { error: out.error, fieldErrors: out.fieldErrors };
  const { joined, password } = out.data;
  try {
    await signIn("credentials", { email: joined.email, password, redirectTo: `/sites/${joined.siteId}` });
  } catch (err) {
    if (err instanceof AuthError)
      return { error: "You joined the site, but signing in failed; sign in with your e-mail and new password." };
    throw err;
  }
  return {};
}
