"use server";

import { AuthError } from "next-auth";
import { headers } from "next/headers";
import { signIn, signOut } from "@/auth";
import { signInSchema } from "@/lib/server/sign-in";
import { admitSignIn } from "@/lib/server/sign-in-limit";
import { zodFieldErrors } from "@/lib/server/guard";

export type SignInState = { error?: string; fieldErrors?: Record<string, string[]> };

export async function signInAction(_prev: SignInState, form: FormData): Promise<SignInState> {
  const parsed = signInSchema.safeParse({ email: form.get("email"), password: form.get("password") });
  if (!parsed.success) return { error: "Check the highlighted fields.", fieldErrors: zodFieldErrors(parsed.error) };
  const refused = await admitSignIn(parsed.data.email, await headers());
  if (refused) return { error: refused.message };
  const next = String(form.get("next") ?? "");
  try {
    await signIn("credentials", {
      ...parsed.data,
      redirectTo: next.startsWith("/") && !next.startsWith("//") ? next : "/sites",
    });
  } catch (err) {
    if (err instanceof AuthError)
      return {
        error:
          "That e-mail and password do not match an account. After five wrong tries from one device, it must wait 15 minutes.",
      };
    throw err;
  }
  return {};
}

/** Ends the session and opens the sign-in page (the header's Sign out button). */
export async function signOutAction(): Promise<void> {
  await signOut({ redirectTo: "/sign-in" });
}
