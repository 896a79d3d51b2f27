import "server-only";
import { eq } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { contexts, users, type Context, type Trench } from "@/db/schema";
import { conflict } from "./errors";
import { formatWhen } from "@/lib/words/when";

/**
 * The lock rule of product.md "Record states", applied by every write to a context, its finds and its relations.
 *
 * - `open`: anyone whose role allows the write may make it.
 * - `awaiting` (submitted for sign-off): the sheet is frozen for everyone, the director included, so that what
 *   the director reviews is exactly what gets signed. A director who wants a change returns the sheet to `open`
 *   with a written reason (sign-off.ts `reopenContext`), which tells its recorders; then it can be edited again.
 * - `signed_off`: frozen until a director reopens it with a written reason.
 *
 * Refusals are 409 and name who submitted or signed off the sheet and when.
 */
export type LockDetails = {
  contextId: string;
  contextNumber: number;
  state: "awaiting" | "signed_off";
  by: string;
  at: string | null;
};

/** "14 Jul 2026, 09:30 UTC": the one date format (lib/words/when.ts), in the reader's language when known. */
export function formatStamp(at: Date | null | undefined, locale?: string): string | null {
  return at ? formatWhen(at, locale) : null;
}

async function nameOf(tx: Db | Tx, userId: string | null, fallback: string): Promise<string> {
  if (!userId) return fallback;
  const [u] = await tx.select({ name: users.name }).from(users).where(eq(users.id, userId));
  return u?.name ?? fallback;
}

/** Whether the context's sheet, finds and relations may be changed now (no reason given; see assertContextWritable). */
export function isContextWritable(context: Pick<Context, "state">): boolean {
  return context.state === "open";
}

/** Refuses any change to a context awaiting sign-off or signed off, naming who and when. */
export async function assertContextWritable(tx: Db | Tx, given: Context, doing = "changed"): Promise<void> {
  // Read the state again under a share lock: a sign-off running at the same moment takes the row FOR UPDATE,
  // so it waits for this write to commit (or this write waits for it and then sees the new state).
  const [fresh] = await tx.select().from(contexts).where(eq(contexts.id, given.id)).for("share");
  const context = fresh ?? given;
  if (context.state === "open") return;
  if (context.state === "signed_off") {
    const who = await nameOf(tx, context.signedOffBy, "a director");
    const when = formatStamp(context.signedOffAt);
    const details: LockDetails = {
      contextId: context.id,
      contextNumber: context.number,
      state: "signed_off",
      by: who,
      at: when,
    };
    throw conflict(
      `Context ${context.number} was signed off by ${who} on ${when ?? "an earlier date"}; it cannot be ${doing} until a director reopens it with a reason.`,
      details,
      "locked",
    );
  }
  const who = await nameOf(tx, context.submittedBy, "a recorder");
  const when = formatStamp(context.submittedAt);
  const details: LockDetails = {
    contextId: context.id,
    contextNumber: context.number,
    state: "awaiting",
    by: who,
    at: when,
  };
  throw conflict(
    `Context ${context.number} was submitted for sign-off by ${who} on ${when ?? "an earlier date"}; it cannot be ${doing} while it awaits sign-off. A director can sign it off or return it to open with a reason.`,
    details,
    "locked",
  );
}

/**
 * The same refusal for a write that touches several contexts at once (an outline edit that would leave finds
 * of these contexts outside, an import into several contexts): the first locked one is named.
 */
export async function assertContextsWritable(
  tx: Db | Tx,
  contextIds: readonly string[],
  doing = "changed",
): Promise<void> {
  for (const id of [...new Set(contextIds)]) {
    const [c] = await tx.select().from(contexts).where(eq(contexts.id, id));
    if (c) await assertContextWritable(tx, c, doing);
  }
}

/**
 * Refuses a change to a signed-off trench as a whole (a redrawn outline, its deletion), naming who
 * signed it off and when. A trench is signed off when all its contexts are (sign-off.ts); reopening any of
 * them reopens the trench. Callers read the trench row `for update` in the same transaction.
 */
export async function assertTrenchWritable(
  tx: Db | Tx,
  trench: Pick<Trench, "code" | "signedOffAt" | "signedOffBy">,
  doing = "changed",
): Promise<void> {
  if (!trench.signedOffAt) return;
  const who = await nameOf(tx, trench.signedOffBy, "a director");
  throw conflict(
    `Trench ${trench.code} was signed off by ${who} on ${formatStamp(trench.signedOffAt)}; it cannot be ${doing} until a director reopens one of its contexts with a reason.`,
    undefined,
    "trench-locked",
  );
}
