import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { contexts, finds, trenches, type Context } from "@/db/schema";
import { isUuid } from "@/lib/schemas/common";
import type { ContextCreate, ContextUpdate } from "@/lib/schemas/context";
import { recordAudit } from "./audit";
import { badInput, conflict, notFound } from "./errors";
import { photosHoldIt, photosOf } from "./attached-photos";
import { assertContextWritable } from "./locks";
import { assertFieldRights } from "./field-rights";
import type { SiteActor } from "./membership";
import { assertOutline, getTrench } from "./trenches";
import { assertContextNumberAllowed } from "./number-blocks";
import { assertVersion, namesAField, nextVersion } from "./versions";
import { written } from "./written";

export async function listContexts(db: Db, siteId: string, trenchId?: string) {
  const where = trenchId
    ? and(eq(contexts.siteId, siteId), eq(contexts.trenchId, trenchId))
    : eq(contexts.siteId, siteId);
  return db.select().from(contexts).where(where).orderBy(asc(contexts.number));
}

export async function getContext(db: Db | Tx, siteId: string, contextId: string): Promise<Context> {
  if (!isUuid(contextId)) throw notFound("That context");
  const [row] = await db
    .select()
    .from(contexts)
    .where(and(eq(contexts.siteId, siteId), eq(contexts.id, contextId)));
  if (!row) throw notFound("That context");
  return row;
}

async function assertNumberFree(tx: Db | Tx, siteId: string, number: number) {
  const [taken] = await tx
    .select({ id: contexts.id })
    .from(contexts)
    .where(and(eq(contexts.siteId, siteId), eq(contexts.number, number)));
  if (taken)
    throw conflict(
      `Context ${number} already exists on this site; context numbers are unique per site.`,
      { number },
      "duplicate",
    );
}

/** The sheet's dates in order, and a mesh size only on a sieved context. */
function assertSheetConsistent(sheet: Pick<Context, "openedOn" | "closedOn" | "digMethod" | "sieveMeshMm">) {
  if (sheet.openedOn && sheet.closedOn && sheet.closedOn < sheet.openedOn) {
    throw badInput("The context was closed before it was opened.", {
      closedOn: ["The closing date is before the opening date."],
    });
  }
  if (sheet.sieveMeshMm != null && sheet.digMethod && sheet.digMethod !== "sieved") {
    throw badInput("A mesh size belongs to a sieved context.", {
      sieveMeshMm: [`A mesh size is given but the method is ${sheet.digMethod}.`],
    });
  }
}

export async function createContext(db: Db, actor: SiteActor, input: ContextCreate) {
  if (input.extent) assertOutline(input.extent, "extent");
  assertSheetConsistent({
    openedOn: input.openedOn ?? null,
    closedOn: input.closedOn ?? null,
    digMethod: input.digMethod ?? null,
    sieveMeshMm: input.sieveMeshMm ?? null,
  });
  return db.transaction(async (tx) => {
    await getTrench(tx, actor.site.id, input.trenchId);
    await assertContextNumberAllowed(tx, actor, input.number);
    await assertNumberFree(tx, actor.site.id, input.number);
    const row = written(
      await tx
        .insert(contexts)
        .values({ ...input, extent: input.extent ?? null, siteId: actor.site.id, recordedBy: actor.userId })
        .returning(),
      "The new context",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "context",
      recordId: row.id,
      after: row,
    });
    return row;
  });
}

export async function updateContext(
  db: Db,
  actor: SiteActor,
  contextId: string,
  input: ContextUpdate,
  expectedVersion: number | null = null,
) {
  assertFieldRights("context", actor.role, input);
  if (input.extent) assertOutline(input.extent, "extent");
  return db.transaction(async (tx) => {
    const before = await getContext(tx, actor.site.id, contextId);
    await assertContextWritable(tx, before);
    assertVersion(before, expectedVersion, `Context ${before.number}`);
    assertSheetConsistent({ ...before, ...input });
    if (input.number !== undefined && input.number !== before.number) {
      await assertContextNumberAllowed(tx, actor, input.number);
      await assertNumberFree(tx, actor.site.id, input.number);
    }
    const after = written(
      await tx
        .update(contexts)
        .set({ ...input, updatedAt: new Date(), ...(namesAField(input) && { version: nextVersion(contexts.version) }) })
        .where(eq(contexts.id, contextId))
        .returning(),
      "The changed context",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "context",
      recordId: contextId,
      before,
      after,
    });
    return after;
  });
}

export async function deleteContext(
  db: Db,
  actor: SiteActor,
  contextId: string,
  expectedVersion: number | null = null,
) {
  return db.transaction(async (tx) => {
    const before = await getContext(tx, actor.site.id, contextId);
    await assertContextWritable(tx, before, "deleted");
    assertVersion(before, expectedVersion, `Context ${before.number}`);
    const [hasFind] = await tx.select({ id: finds.id }).from(finds).where(eq(finds.contextId, contextId)).limit(1);
    if (hasFind) throw conflict(`Context ${before.number} still has finds; move or delete them first.`);
    const pictured = (await photosOf(tx, "context", [contextId])).get(contextId);
    if (pictured) throw conflict(`Context ${before.number} was not deleted: ${photosHoldIt(pictured)}.`);
    await tx.delete(contexts).where(eq(contexts.id, contextId));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "context",
      recordId: contextId,
      before,
    });
    return { deleted: contextId };
  });
}

/** The context list: every sheet with its trench code and how many finds it holds. */
export async function contextSummaries(db: Db, siteId: string, trenchId?: string) {
  const where = trenchId
    ? and(eq(contexts.siteId, siteId), eq(contexts.trenchId, trenchId))
    : eq(contexts.siteId, siteId);
  return db
    .select({
      id: contexts.id,
      number: contexts.number,
      type: contexts.type,
      state: contexts.state,
      description: contexts.description,
      trenchId: contexts.trenchId,
      trenchCode: trenches.code,
      finds: sql<number>`(select count(*) from ${finds} where ${finds.contextId} = ${contexts.id})`.mapWith(Number),
    })
    .from(contexts)
    .innerJoin(trenches, eq(trenches.id, contexts.trenchId))
    .where(where)
    .orderBy(asc(contexts.number));
}
