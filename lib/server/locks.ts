import "server-only";
import { eq } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { users, type Context } from "@/db/schema";
import { conflict } from "./errors";

/** Refuses any change to a signed-off context, its finds or its relations, naming who locked it and when. */
export async function assertContextWritable(tx: Db | Tx, context: Context, doing = "changed"): Promise<void> {
  if (context.state !== "signed_off") return;
  let who = "a director";
  if (context.signedOffBy) {
    const [u] = await tx.select({ name: users.name }).from(users).where(eq(users.id, context.signedOffBy));
    if (u) who = u.name;
  }
  const when = context.signedOffAt ? context.signedOffAt.toISOString().slice(0, 16).replace("T", " ") + " UTC" : "earlier";
  throw conflict(
    `Context ${context.number} was signed off by ${who} on ${when}; it cannot be ${doing} until a director reopens it with a reason.`,
  );
}
