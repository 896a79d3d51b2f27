import "server-only";
import { and, asc, eq, or } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { contextRelations, contexts, type ContextRelation } from "@/db/schema";
import {
  readingFrom,
  readingLabels,
  toStored,
  type RelationCreate,
  type RelationReading,
} from "@/lib/schemas/relation";
import { recordAudit } from "./audit";
import { badInput, conflict, notFound } from "./errors";
import { assertContextWritable } from "./locks";
import { buildMatrix, loopIfAdded, type Matrix } from "./matrix";
import type { SiteActor } from "./membership";
import { getContext } from "./contexts";
import { lockSiteNumbers } from "./find-numbers";
import { written } from "./written";

export async function listRelations(db: Db | Tx, siteId: string): Promise<ContextRelation[]> {
  return db
    .select()
    .from(contextRelations)
    .where(eq(contextRelations.siteId, siteId))
    .orderBy(asc(contextRelations.createdAt));
}

/** The numbered contexts of a site, the nodes the matrix is drawn from. */
async function siteContexts(db: Db | Tx, siteId: string) {
  return db
    .select({
      id: contexts.id,
      number: contexts.number,
      type: contexts.type,
      state: contexts.state,
      trenchId: contexts.trenchId,
    })
    .from(contexts)
    .where(eq(contexts.siteId, siteId))
    .orderBy(asc(contexts.number));
}

export type ContextReading = {
  relationId: string;
  reading: RelationReading;
  label: string;
  otherId: string;
  otherNumber: number;
  redundant: boolean;
};

/** The relations of one context as its sheet reads them: each stored row seen from this side. */
export async function relationsOfContext(db: Db, siteId: string, contextId: string): Promise<ContextReading[]> {
  const [all, ctxs] = await Promise.all([listRelations(db, siteId), siteContexts(db, siteId)]);
  const numbers = new Map(ctxs.map((c) => [c.id, c.number]));
  const redundant = new Set(
    buildMatrix(ctxs, all)
      .edges.filter((e) => e.redundant)
      .map((e) => e.relation.id),
  );
  return all
    .filter((r) => r.fromId === contextId || r.toId === contextId)
    .map((r) => {
      const { reading, otherId } = readingFrom(r, contextId);
      return {
        relationId: r.id,
        reading,
        label: readingLabels[reading],
        otherId,
        otherNumber: numbers.get(otherId) ?? NaN,
        redundant: redundant.has(r.id),
      };
    })
    .sort((p, q) => p.reading.localeCompare(q.reading) || p.otherNumber - q.otherNumber);
}

/**
 * Adds one stratigraphic relation. Stored once per pair whichever sheet it was typed on; refused when
 * either context is signed off, when the pair already has a relation, or when it would close a loop.
 */
export async function addRelation(db: Db, actor: SiteActor, input: RelationCreate) {
  const stored = toStored(input.contextId, input.reading, input.otherId);
  return db.transaction(async (tx) => {
    // Relation writes of one site queue on the site row, so two people cannot close a loop between them.
    await lockSiteNumbers(tx, actor.site.id);
    const from = await getContext(tx, actor.site.id, stored.fromId);
    const to = await getContext(tx, actor.site.id, stored.toId);
    await assertContextWritable(tx, from, "given new relations");
    await assertContextWritable(tx, to, "given new relations");
    const [existing] = await tx
      .select()
      .from(contextRelations)
      .where(
        or(
          and(eq(contextRelations.fromId, from.id), eq(contextRelations.toId, to.id)),
          and(eq(contextRelations.fromId, to.id), eq(contextRelations.toId, from.id)),
        ),
      );
    if (existing) {
      // Said from the sheet the person is typing on.
      const [here, there] = input.contextId === from.id ? [from, to] : [to, from];
      const seen = readingFrom(existing, here.id);
      throw conflict(
        `Contexts ${here.number} and ${there.number} are already related: ${here.number} ${readingLabels[seen.reading]} ${there.number}. Remove that relation first to change it.`,
      );
    }
    const all = await listRelations(tx, actor.site.id);
    const ctxs = await siteContexts(tx, actor.site.id);
    const loop = loopIfAdded(ctxs, all, { id: "new", ...stored });
    if (loop) {
      throw badInput(
        `That relation would make the matrix loop back on itself: ${loop}. A context cannot be both earlier and later than another.`,
        { otherId: [`That would make a loop: ${loop}. A context cannot be both earlier and later than another.`] },
        { loop },
      );
    }
    const row = written(
      await tx
        .insert(contextRelations)
        .values({ ...stored, siteId: actor.site.id, createdBy: actor.userId })
        .returning(),
      "The new relation",
    );
    const after = { ...row, reads: `${from.number} ${readingLabels[row.kind]} ${to.number}` };
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "relation",
      recordId: row.id,
      after,
    });
    return after;
  });
}

export async function removeRelation(db: Db, actor: SiteActor, relationId: string) {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .select()
      .from(contextRelations)
      .where(and(eq(contextRelations.siteId, actor.site.id), eq(contextRelations.id, relationId)));
    if (!row) throw notFound("That relation");
    const from = await getContext(tx, actor.site.id, row.fromId);
    const to = await getContext(tx, actor.site.id, row.toId);
    await assertContextWritable(tx, from, "changed (nor its relations)");
    await assertContextWritable(tx, to, "changed (nor its relations)");
    await tx.delete(contextRelations).where(eq(contextRelations.id, relationId));
    const before = { ...row, reads: `${from.number} ${readingLabels[row.kind]} ${to.number}` };
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "relation",
      recordId: row.id,
      before,
    });
    return { deleted: relationId };
  });
}

export type SiteMatrix = Matrix & { contexts: Awaited<ReturnType<typeof siteContexts>> };

/** The whole site's matrix, optionally of one trench's contexts only. */
export async function siteMatrix(db: Db, siteId: string, trenchId?: string): Promise<SiteMatrix> {
  const [all, ctxs] = await Promise.all([listRelations(db, siteId), siteContexts(db, siteId)]);
  const chosen = trenchId ? ctxs.filter((c) => c.trenchId === trenchId) : ctxs;
  const ids = new Set(chosen.map((c) => c.id));
  const rels = all.filter((r) => ids.has(r.fromId) && ids.has(r.toId));
  return { ...buildMatrix(chosen, rels), contexts: chosen };
}
