import "server-only";
import { eq } from "drizzle-orm";
import { z } from "zod";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import { checkPassword } from "./passwords";

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter the e-mail address you were invited with."),
  password: z.string().min(1, "Enter your password."),
});

/**
 * Checks e-mail and password; returns the user or null. Guessing is limited before this is reached, by the
 * sign-in limits (lib/server/sign-in-limit.ts) at every door that leads here.
 */
export async function verifySignIn(
  raw: unknown,
): Promise<{ id: string; email: string; name: string; sessionVersion: number } | null> {
  const parsed = signInSchema.safeParse(raw);
  if (!parsed.success) return null;
  const { email, password } = parsed.data;
  const db = await getDb();
  const [user] = await db.select().from(users).where(eq(users.email, email));
  const ok = user ? await checkPassword(password, user.passwordHash) : false;
  return ok && user ? { id: user.id, email: user.email, name: user.name, sessionVersion: user.sessionVersion } : null;
}
