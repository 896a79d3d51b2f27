import "server-only";
import { eq, sql } from "drizzle-orm";
import { z } from "zod";
import { getDb } from "@/db/client";
import { signInFailures, users } from "@/db/schema";
import { checkPassword } from "./passwords";

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter the e-mail address you were invited with."),
  password: z.string().min(1, "Enter your password."),
});

/** Failures forgotten after this long without another one. */
const FAILURE_MEMORY_MS = 15 * 60_000;

/**
 * Delay before answering a sign-in for an address with `failures` recent failed tries:
 * none for the first three, then doubling from 1 s up to 8 s — enough to make guessing slow,
 * short enough that a digger with wet gloves who mistypes twice is not locked out.
 */
export function signInDelayMs(failures: number): number {
  if (failures < 3) return 0;
  return Math.min(8000, 1000 * 2 ** (failures - 3));
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Checks e-mail and password; returns the user or null. Repeated failures slow every later try. */
export async function verifySignIn(
  raw: unknown,
  wait: (ms: number) => Promise<unknown> = sleep,
): Promise<{ id: string; email: string; name: string; sessionVersion: number } | null> {
  const parsed = signInSchema.safeParse(raw);
  if (!parsed.success) return null;
  const { email, password } = parsed.data;
  const db = await getDb();
  const [record] = await db.select().from(signInFailures).where(eq(signInFailures.email, email));
  const recent = record && Date.now() - record.lastFailureAt.getTime() < FAILURE_MEMORY_MS ? record.failures : 0;
  await wait(signInDelayMs(recent));
  const [user] = await db.select().from(users).where(eq(users.email, email));
  const ok = user ? await checkPassword(password, user.passwordHash) : false;
  if (ok && user) {
    if (record) await db.delete(signInFailures).where(eq(signInFailures.email, email));
    return { id: user.id, email: user.email, name: user.name, sessionVersion: user.sessionVersion };
  }
  await db
    .insert(signInFailures)
    .values({ email, failures: recent + 1, lastFailureAt: new Date() })
    .onConflictDoUpdate({
      target: signInFailures.email,
      set: { failures: sql`${recent + 1}`, lastFailureAt: new Date() },
    });
  return null;
}
