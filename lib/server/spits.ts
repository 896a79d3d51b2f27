import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { finds, spits, type Spit } from "@/db/schema";
import type { SpitCreate, SpitUpdate } from "@/lib/schemas/levels";
import { recordAudit } from "./audit";
import { badInput, conflict, notFound } from "./errors";
import { assertContextWritable } from "./locks";
import { assertFieldRights } from "./field-rights";
import type { SiteActor } from "./membership";
import { getContext } from "./contexts";

/** A spit's top lies above its base: both are reduced levels, so top ≥ base. */
function assertOrder(top: number | null | undefined, base: number | null | undefined) {
  if (top != null && base != null && top < base) {
    throw badInput("A spit's top level lies above its base level.", {
      baseLevel: ["The base level is higher than the top level."],
    });
  }
}

export async function listSpits(db: Db | Tx, siteId: string, contextId: string): Promise<Spit[]> {
  return db
    .select()
    .from(spits)
    .where(and(eq(spits.siteId, siteId), eq(spits.contextId, contextId)))
    .orderBy(asc(spits.number));
}

async function getSpit(tx: Tx, siteId: string, contextId: string, spitId: string): Promise<Spit> {
  const [row] = await tx
    .select()
    .from(spits)
    .where(and(eq(spits.siteId, siteId), eq(spits.contextId, contextId), eq(spits.id, spitId)));
  if (!row) throw notFound("That spit");
  return row;
}

async function assertNumberFree(tx: Tx, contextId: string, number: number, except?: string) {
  const [taken] = await tx
    .select({ id: spits.id })
    .from(spits)
    .where(and(eq(spits.contextId, contextId), eq(spits.number, number)));
  if (taken && taken.id !== except) throw conflict(`Spit ${number} already exists in this context.`);
}

export async function createSpit(db: Db, actor: SiteActor, contextId: string, input: SpitCreate) {
  assertOrder(input.topLevel, input.baseLevel);
  return db.transaction(async (tx) => {
    const context = await getContext(tx, actor.site.id, contextId);
    await assertContextWritable(tx, context, "given new spits");
    await assertNumberFree(tx, context.id, input.number);
    const [row] = await tx
      .insert(spits)
      .values({
        siteId: actor.site.id,
        contextId: context.id,
        number: input.number,
        topLevel: input.topLevel ?? null,
        baseLevel: input.baseLevel ?? null,
        createdBy: actor.userId,
      })
      .returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "spit",
      recordId: row!.id,
      after: row,
    });
    return row!;
  });
}

export async function updateSpit(db: Db, actor: SiteActor, contextId: string, spitId: string, input: SpitUpdate) {
  assertFieldRights("spit", actor.role, input);
  return db.transaction(async (tx) => {
    const context = await getContext(tx, actor.site.id, contextId);
    const before = await getSpit(tx, actor.site.id, context.id, spitId);
    await assertContextWritable(tx, context, "given changed spits");
    // An update that names no field changes nothing (and writes no audit entry).
    if (!Object.keys(input).length) return before;
    assertOrder(
      input.topLevel === undefined ? before.topLevel : input.topLevel,
      input.baseLevel === undefined ? before.baseLevel : input.baseLevel,
    );
    if (input.number !== undefined) await assertNumberFree(tx, context.id, input.number, before.id);
    const [after] = await tx.update(spits).set(input).where(eq(spits.id, before.id)).returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "spit",
      recordId: before.id,
      before,
      after,
    });
    return after!;
  });
}

export async function deleteSpit(db: Db, actor: SiteActor, contextId: string, spitId: string) {
  return db.transaction(async (tx) => {
    const context = await getContext(tx, actor.site.id, contextId);
    const before = await getSpit(tx, actor.site.id, context.id, spitId);
    await assertContextWritable(tx, context, "given changed spits");
    const [held] = await tx.select({ number: finds.number }).from(finds).where(eq(finds.spitId, before.id)).limit(1);
    if (held)
      throw conflict(`Spit ${before.number} still holds finds (for example find ${held.number}); move them first.`);
    await tx.delete(spits).where(eq(spits.id, before.id));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "spit",
      recordId: before.id,
      before,
    });
    return { deleted: before.id };
  });
}
