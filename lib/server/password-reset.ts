import "server-only";
import { and, eq, gt, isNull, sql } from "drizzle-orm";
import { z } from "zod";
import type { Db } from "@/db/client";
import { passwordResets, users } from "@/db/schema";
import { env } from "@/lib/env";
import { resetConfirmSchema, resetRequestSchema } from "@/lib/schemas/account";
import { conflict } from "./errors";
import { hashToken, newToken } from "./invitations";
import { passwordResetMail } from "./mail/templates/password-reset";
import { deliver } from "./mail/transport";
import { hashPassword } from "./passwords";
import { endSessions } from "./session-version";
import { clearSignInLimits } from "./sign-in-limit";
import { written } from "./written";

/** A reset link works for an hour (common practice for password-reset links). */
export const RESET_MINUTES = 60;
/** At most this many unused links per account and hour, so the form cannot be used to flood someone's inbox. */
export const RESETS_PER_HOUR = 3;

export { resetConfirmSchema, resetRequestSchema };

export const resetLink = (token: string) => `${env().APP_URL}/reset-password/${token}`;

/**
 * Mails a reset link when the address has an account. The answer is the same either way, so the form
 * does not tell a stranger which addresses have accounts.
 */
export async function requestPasswordReset(db: Db, email: string): Promise<{ accepted: true }> {
  const [user] = await db.select().from(users).where(eq(users.email, email));
  if (!user) return { accepted: true };
  const [recent] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(passwordResets)
    .where(
      and(
        eq(passwordResets.userId, user.id),
        isNull(passwordResets.usedAt),
        gt(passwordResets.createdAt, new Date(Date.now() - 3600_000)),
      ),
    );
  if ((recent?.n ?? 0) >= RESETS_PER_HOUR) return { accepted: true };
  const token = newToken();
  const expiresAt = new Date(Date.now() + RESET_MINUTES * 60_000);
  await db.insert(passwordResets).values({ userId: user.id, tokenHash: hashToken(token), expiresAt });
  await deliver([user.email], () => passwordResetMail({ name: user.name, link: resetLink(token), expiresAt }));
  return { accepted: true };
}

/**
 * Sets the new password, uses up the link and every other open link of the account, ends every session the
 * account had (whoever knew the old password may hold one), and clears the sign-in limits of the account.
 */
export async function confirmPasswordReset(
  db: Db,
  input: z.infer<typeof resetConfirmSchema>,
): Promise<{ email: string }> {
  return db.transaction(async (tx) => {
    const [reset] = await tx
      .select()
      .from(passwordResets)
      .where(
        and(
          eq(passwordResets.tokenHash, hashToken(input.token)),
          isNull(passwordResets.usedAt),
          gt(passwordResets.expiresAt, new Date()),
        ),
      )
      .for("update");
    if (!reset) throw conflict("This reset link has expired or has already been used; ask for a new one.");
    const user = written(
      await tx
        .update(users)
        .set({ passwordHash: await hashPassword(input.password) })
        .where(eq(users.id, reset.userId))
        .returning(),
      "The new password",
    );
    await endSessions(tx, user.id);
    await tx
      .update(passwordResets)
      .set({ usedAt: new Date() })
      .where(and(eq(passwordResets.userId, reset.userId), isNull(passwordResets.usedAt)));
    await clearSignInLimits(tx, user.email);
    return { email: user.email };
  });
}
