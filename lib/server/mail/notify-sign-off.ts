import "server-only";
import { and, eq, inArray, ne, sql } from "drizzle-orm";
import type { Db } from "@/db/client";
import { finds, memberships, trenches, users, type Context } from "@/db/schema";
import { env } from "@/lib/env";
import type { SiteActor } from "../membership";
import { contextReopenedMail } from "./templates/context-reopened";
import { contextSignedOffMail } from "./templates/context-signed-off";
import { contextSubmittedMail } from "./templates/context-submitted";
import { deliver, type Delivery } from "./transport";

/**
 * Who hears about what (issue "E-mail"): submitted → directors; signed off → its recorders; reopened → every member.
 */

async function emailsOf(db: Db, ids: (string | null)[], exceptUserId: string): Promise<string[]> {
  const wanted = [...new Set(ids.filter((i): i is string => !!i && i !== exceptUserId))];
  if (!wanted.length) return [];
  return (await db.select({ email: users.email }).from(users).where(inArray(users.id, wanted))).map((u) => u.email);
}

async function actorName(db: Db, actor: SiteActor): Promise<string> {
  const [u] = await db.select({ name: users.name }).from(users).where(eq(users.id, actor.userId));
  return u?.name ?? "A member";
}

async function trenchCode(db: Db, trenchId: string): Promise<string> {
  const [t] = await db.select({ code: trenches.code }).from(trenches).where(eq(trenches.id, trenchId));
  return t?.code ?? "?";
}

const sheetLink = (c: Context) => `${env().APP_URL}/sites/${c.siteId}/contexts/${c.id}`;

/** The people who recorded the sheet or any of its finds, or submitted it. */
export async function contextRecorderIds(db: Db, c: Context): Promise<string[]> {
  const fr = await db.selectDistinct({ id: finds.recordedBy }).from(finds).where(eq(finds.contextId, c.id));
  return [c.recordedBy, c.submittedBy, ...fr.map((f) => f.id)].filter((i): i is string => !!i);
}

export async function notifySubmitted(db: Db, actor: SiteActor, c: Context): Promise<Delivery> {
  const directors = await db
    .select({ id: memberships.userId })
    .from(memberships)
    .where(
      and(eq(memberships.siteId, c.siteId), eq(memberships.role, "director"), ne(memberships.userId, actor.userId)),
    );
  const to = await emailsOf(
    db,
    directors.map((d) => d.id),
    actor.userId,
  );
  const [counted] = await db
    .select({ count: sql<number>`count(*)::int` })
    .from(finds)
    .where(eq(finds.contextId, c.id));
  const count = counted?.count ?? 0;
  const mail = contextSubmittedMail({
    siteCode: actor.site.code,
    contextNumber: c.number,
    trenchCode: await trenchCode(db, c.trenchId),
    submittedBy: await actorName(db, actor),
    finds: count,
    link: `${env().APP_URL}/sites/${c.siteId}/sign-off`,
  });
  return deliver(to, () => mail);
}

export async function notifySignedOff(
  db: Db,
  actor: SiteActor,
  c: Context,
  trenchSignedOff: boolean,
): Promise<Delivery> {
  const to = await emailsOf(db, await contextRecorderIds(db, c), actor.userId);
  const mail = contextSignedOffMail({
    siteCode: actor.site.code,
    contextNumber: c.number,
    trenchCode: await trenchCode(db, c.trenchId),
    signedOffBy: await actorName(db, actor),
    at: c.signedOffAt ?? new Date(),
    trenchSignedOff,
    link: sheetLink(c),
  });
  return deliver(to, () => mail);
}

export async function notifyReopened(
  db: Db,
  actor: SiteActor,
  c: Context,
  how: { from: "awaiting" | "signed_off"; reason: string; at: Date },
): Promise<Delivery> {
  const members = await db.select({ id: memberships.userId }).from(memberships).where(eq(memberships.siteId, c.siteId));
  const to = await emailsOf(
    db,
    members.map((m) => m.id),
    actor.userId,
  );
  const mail = contextReopenedMail({
    siteCode: actor.site.code,
    contextNumber: c.number,
    trenchCode: await trenchCode(db, c.trenchId),
    reopenedBy: await actorName(db, actor),
    at: how.at,
    reason: how.reason,
    from: how.from,
    link: sheetLink(c),
  });
  return deliver(to, () => mail);
}
