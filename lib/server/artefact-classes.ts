import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { artefactClasses, contexts, finds, type ArtefactClass } from "@/db/schema";
import type { z } from "zod";
import type { artefactClassCreateSchema, artefactClassUpdateSchema } from "@/lib/schemas/artefact-class";
import { recordAudit } from "./audit";
import { badInput, conflict, notFound } from "./errors";
import { assertFieldRights } from "./field-rights";
import type { SiteActor } from "./membership";
import { written } from "./written";

export async function listClasses(db: Db, siteId: string) {
  return db.select().from(artefactClasses).where(eq(artefactClasses.siteId, siteId)).orderBy(asc(artefactClasses.code));
}

/** The site's classes as a plan or a key draws them (code, label, colour, symbol), in code order. */
export async function listClassLooks(db: Db, siteId: string) {
  return db
    .select({
      id: artefactClasses.id,
      code: artefactClasses.code,
      label: artefactClasses.label,
      colour: artefactClasses.colour,
      symbol: artefactClasses.symbol,
    })
    .from(artefactClasses)
    .where(eq(artefactClasses.siteId, siteId))
    .orderBy(asc(artefactClasses.code));
}

/** The class a find is given, or a 400 on `classId` when it is not one of this site's classes. */
export async function assertSiteClass(tx: Db | Tx, siteId: string, classId: string) {
  const [row] = await tx
    .select()
    .from(artefactClasses)
    .where(and(eq(artefactClasses.siteId, siteId), eq(artefactClasses.id, classId)));
  if (!row) throw badInput("That artefact class is not one of this site's classes.", { classId: ["Unknown class."] });
  return row;
}

export async function createClass(db: Db, actor: SiteActor, input: z.infer<typeof artefactClassCreateSchema>) {
  return db.transaction(async (tx) => {
    const [taken] = await tx
      .select({ id: artefactClasses.id })
      .from(artefactClasses)
      .where(and(eq(artefactClasses.siteId, actor.site.id), eq(artefactClasses.code, input.code)));
    if (taken) throw conflict(`The class code ${input.code} is already used on this site.`);
    const row = written(
      await tx
        .insert(artefactClasses)
        .values({ ...input, siteId: actor.site.id })
        .returning(),
      "The class",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "class",
      recordId: row.id,
      after: row,
    });
    return row;
  });
}

/**
 * When a change alters how signed-off records read (code, label or human-remains flag), the trail says
 * which: those records keep the class as signed off and show the change (see class-history.ts).
 */
async function signedOffUse(tx: Tx, before: ArtefactClass, after: ArtefactClass): Promise<string | null> {
  if (before.code === after.code && before.label === after.label && before.humanRemains === after.humanRemains)
    return null;
  const rows = await tx
    .select({ number: contexts.number, n: sql<number>`count(*)::int` })
    .from(finds)
    .innerJoin(contexts, eq(contexts.id, finds.contextId))
    .where(and(eq(finds.classId, before.id), eq(contexts.state, "signed_off")))
    .groupBy(contexts.number)
    .orderBy(asc(contexts.number));
  if (rows.length === 0) return null;
  const total = rows.reduce((s, r) => s + r.n, 0);
  const list = rows.map((r) => r.number).join(", ");
  return `Changed after sign-off of ${total} find${total === 1 ? "" : "s"} of this class (context${rows.length === 1 ? "" : "s"} ${list}); those records keep the class as signed off and show this change.`;
}

export async function updateClass(
  db: Db,
  actor: SiteActor,
  classId: string,
  input: z.infer<typeof artefactClassUpdateSchema>,
) {
  assertFieldRights("class", actor.role, input);
  return db.transaction(async (tx) => {
    const [before] = await tx
      .select()
      .from(artefactClasses)
      .where(and(eq(artefactClasses.siteId, actor.site.id), eq(artefactClasses.id, classId)));
    if (!before) throw notFound("That artefact class");
    // An update that names no field changes nothing (and writes no audit entry).
    if (!Object.keys(input).length) return before;
    const after = written(
      await tx.update(artefactClasses).set(input).where(eq(artefactClasses.id, classId)).returning(),
      "The class",
    );
    const reason = await signedOffUse(tx, before, after);
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "class",
      recordId: classId,
      before,
      after,
      reason,
    });
    return after;
  });
}
