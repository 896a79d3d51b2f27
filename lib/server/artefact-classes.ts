import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { artefactClasses } from "@/db/schema";
import type { z } from "zod";
import type { artefactClassCreateSchema, artefactClassUpdateSchema } from "@/lib/schemas/artefact-class";
import { recordAudit } from "./audit";
import { conflict, notFound } from "./errors";
import type { SiteActor } from "./membership";

export async function listClasses(db: Db, siteId: string) {
  return db.select().from(artefactClasses).where(eq(artefactClasses.siteId, siteId)).orderBy(asc(artefactClasses.code));
}

export async function createClass(db: Db, actor: SiteActor, input: z.infer<typeof artefactClassCreateSchema>) {
  return db.transaction(async (tx) => {
    const [taken] = await tx.select({ id: artefactClasses.id }).from(artefactClasses).where(and(eq(artefactClasses.siteId, actor.site.id), eq(artefactClasses.code, input.code)));
    if (taken) throw conflict(`The class code ${input.code} is already used on this site.`);
    const [row] = await tx.insert(artefactClasses).values({ ...input, siteId: actor.site.id }).returning();
    await recordAudit(tx, { siteId: actor.site.id, actorId: actor.userId, action: "create", recordType: "class", recordId: row.id, after: row });
    return row;
  });
}

export async function updateClass(db: Db, actor: SiteActor, classId: string, input: z.infer<typeof artefactClassUpdateSchema>) {
  return db.transaction(async (tx) => {
    const [before] = await tx.select().from(artefactClasses).where(and(eq(artefactClasses.siteId, actor.site.id), eq(artefactClasses.id, classId)));
    if (!before) throw notFound("That artefact class");
    const [after] = await tx.update(artefactClasses).set(input).where(eq(artefactClasses.id, classId)).returning();
    await recordAudit(tx, { siteId: actor.site.id, actorId: actor.userId, action: "update", recordType: "class", recordId: classId, before, after });
    return after;
  });
}
