"use server";

import { AuthError } from "next-auth";
import { signIn } from "@/auth";
import { getDb } from "@/db/client";
import { toFailure } from "@/lib/server/guard";
import { acceptInvitation, invitationAcceptSchema } from "@/lib/server/invitations";

export type AcceptState = { error?: string; fieldErrors?: Record<string, string[]> };

/** Accepts the invitation, then signs the person in and opens the site they joined. */
export async function acceptAction(_prev: AcceptState, form: FormData): Promise<AcceptState> {
  const raw = { token: form.get("token"), name: form.get("name") || undefined, password: form.get("password") };
  const parsed = invitationAcceptSchema.safeParse(raw);
  if (!parsed.success) return toFailure(parsed.error);
  let joined: { siteId: string; email: string };
  try {
    joined = await acceptInvitation(await getDb(), parsed.data);
  } catch (err) {
    const f = toFailure(err);
    return { error: f.error, fieldErrors: f.fieldErrors };
  }
  try {
    await signIn("credentials", { email: joined.email, password: parsed.data.password, redirectTo: `/sites/${joined.siteId}` });
  } catch (err) {
    if (err instanceof AuthError) return { error: "You joined the site, but signing in failed; sign in with your e-mail and new password." };
    throw err;
  }
  return {};
}
