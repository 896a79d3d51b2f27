import "server-only";
import { eq, sql } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";

/**
 * Sessions are signed cookies, so the server cannot delete them; instead each carries the account's session
 * version from sign-in, and a session is honoured only while the account still has that version. Raising the
 * version (signing out, a password reset) ends every session the account had, on every device.
 * This module imports no auth code, so both auth.ts and the use cases can call it.
 */
export async function sessionIsCurrent(userId: unknown, version: unknown): Promise<boolean> {
  if (typeof userId !== "string" || typeof version !== "number") return false;
  const db = await getDb();
  const [row] = await db.select({ v: users.sessionVersion }).from(users).where(eq(users.id, userId));
  return row !== undefined && row.v === version;
}

/** Ends every session of the account (signing out, a password reset). */
export async function endSessions(db: Db | Tx, userId: string): Promise<void> {
  await db
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId));
}
