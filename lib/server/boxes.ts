import "server-only";
import { and, asc, count, eq, ilike, inArray, sql, type SQL } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { artefactClasses, boxes, contexts, finds, samples, sites, trenches, type Box } from "@/db/schema";
import { isUuid } from "@/lib/schemas/common";
import type { BoxCreate, BoxListQuery, BoxUpdate, SamplesStore } from "@/lib/schemas/processing";
import { sampleTypeLabels } from "@/lib/schemas/sample";
import { countOf } from "@/lib/words/count";
import { recordAudit } from "./audit";
import { PublicError, badInput, conflict, notFound } from "./errors";
import { assertFieldRights } from "./field-rights";
import type { SiteActor } from "./membership";

/**
 * The box register: the finds store's boxes, numbered per site, each kept in a store. A box's contents are
 * the finds and samples whose location is that box. Boxes come after the trench: nothing here is locked
 * with a context.
 */

export async function getBox(db: Db | Tx, siteId: string, boxId: string): Promise<Box> {
  if (!isUuid(boxId)) throw notFound("That box");
  const [row] = await db
    .select()
    .from(boxes)
    .where(and(eq(boxes.siteId, siteId), eq(boxes.id, boxId)));
  if (!row) throw notFound("That box");
  return row;
}

/** A box named in a write's body: not this site's is bad input on the field, not a missing page. */
export async function boxInSite(tx: Db | Tx, siteId: string, boxId: string): Promise<Box> {
  const [row] = isUuid(boxId)
    ? await tx
        .select()
        .from(boxes)
        .where(and(eq(boxes.siteId, siteId), eq(boxes.id, boxId)))
    : [];
  if (!row) throw badInput("That box is not one of this site's boxes.", { boxId: ["Unknown box."] });
  return row;
}

const duplicate = (n: number) =>
  new PublicError(
    409,
    `Box ${n} is already in the register.`,
    { number: [`Box ${n} exists.`] },
    undefined,
    "duplicate",
  );

async function assertNumberFree(tx: Tx, siteId: string, n: number, except?: string) {
  const [hit] = await tx
    .select({ id: boxes.id })
    .from(boxes)
    .where(and(eq(boxes.siteId, siteId), eq(boxes.number, n)));
  if (hit && hit.id !== except) throw duplicate(n);
}

export async function createBox(db: Db, actor: SiteActor, input: BoxCreate) {
  return db.transaction(async (tx) => {
    // The site row's lock orders two new boxes at once, so each takes its own next number.
    await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, actor.site.id)).for("update");
    let number = input.number;
    if (number === undefined) {
      const [top] = await tx
        .select({ n: sql<number>`coalesce(max(${boxes.number}), 0)`.mapWith(Number) })
        .from(boxes)
        .where(eq(boxes.siteId, actor.site.id));
      number = (top?.n ?? 0) + 1;
    } else await assertNumberFree(tx, actor.site.id, number);
    const [row] = await tx
      .insert(boxes)
      .values({ siteId: actor.site.id, number, store: input.store, note: input.note, createdBy: actor.userId })
      .returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "box",
      recordId: row!.id,
      after: row,
    });
    return row!;
  });
}

export async function updateBox(db: Db, actor: SiteActor, boxId: string, input: BoxUpdate) {
  assertFieldRights("box", actor.role, input);
  return db.transaction(async (tx) => {
    const before = await getBox(tx, actor.site.id, boxId);
    const [locked] = await tx.select().from(boxes).where(eq(boxes.id, before.id)).for("update");
    if (!Object.keys(input).length) return locked!;
    if (input.number !== undefined) await assertNumberFree(tx, actor.site.id, input.number, before.id);
    const [after] = await tx
      .update(boxes)
      .set({ ...input, updatedAt: new Date() })
      .where(eq(boxes.id, before.id))
      .returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "box",
      recordId: before.id,
      before: locked,
      after,
    });
    return after!;
  });
}

/**
 * Deletes a box made by mistake. Only an empty box goes: a box that still holds finds or samples is refused,
 * saying how many, because deleting it would lose where they are kept. Its number is free again (boxes are
 * numbered for the store's shelves, not accounted like finds). The box row's lock keeps a find from being put
 * in it while it is checked.
 */
export async function deleteBox(db: Db, actor: SiteActor, boxId: string) {
  return db.transaction(async (tx) => {
    const before = await getBox(tx, actor.site.id, boxId);
    await tx.select({ id: boxes.id }).from(boxes).where(eq(boxes.id, before.id)).for("update");
    const [[inFinds], [inSamples]] = await Promise.all([
      tx.select({ n: count() }).from(finds).where(eq(finds.boxId, before.id)),
      tx.select({ n: count() }).from(samples).where(eq(samples.boxId, before.id)),
    ]);
    const held = { finds: inFinds?.n ?? 0, samples: inSamples?.n ?? 0 };
    if (held.finds || held.samples) {
      const what = [held.finds && countOf(held.finds, "find"), held.samples && countOf(held.samples, "sample")].filter(
        Boolean,
      );
      throw conflict(
        `Box ${before.number} still holds ${what.join(" and ")}; only an empty box can be deleted. Move ${
          held.finds + held.samples === 1 ? "it" : "them"
        } to another box first, then delete the box.`,
        held,
        "conflict",
      );
    }
    await tx.delete(boxes).where(eq(boxes.id, before.id));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "box",
      recordId: before.id,
      before,
    });
    return { deleted: before.id, number: before.number };
  });
}

/** The box register, in number order, with how many finds and samples each holds. */
export async function listBoxes(db: Db, siteId: string, q: BoxListQuery) {
  const where: SQL[] = [eq(boxes.siteId, siteId)];
  if (q.store) where.push(ilike(boxes.store, `%${q.store.replace(/[%_\\]/g, (c) => `\\${c}`)}%`));
  const filter = and(...where);
  const [rows, [total]] = await Promise.all([
    db
      .select({
        id: boxes.id,
        number: boxes.number,
        store: boxes.store,
        note: boxes.note,
        // Written out in full: inside a sub-select the column names alone would bind to the inner table.
        finds: sql<number>`(select count(*) from "finds" where "finds"."box_id" = "boxes"."id")`.mapWith(Number),
        samples: sql<number>`(select count(*) from "samples" where "samples"."box_id" = "boxes"."id")`.mapWith(Number),
      })
      .from(boxes)
      .where(filter)
      .orderBy(asc(boxes.number))
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize),
    db.select({ n: count() }).from(boxes).where(filter),
  ]);
  return { page: q.page, pageSize: q.pageSize, total: total?.n ?? 0, rows };
}

/** What is in a box: its finds (number, class, context) and samples (number, type, context), in number order. */
export async function boxContents(db: Db | Tx, box: Box) {
  const [boxFinds, boxSamples] = await Promise.all([
    db
      .select({
        id: finds.id,
        number: finds.number,
        classCode: artefactClasses.code,
        classLabel: artefactClasses.label,
        contextNumber: contexts.number,
        trenchCode: trenches.code,
        processing: finds.processing,
      })
      .from(finds)
      .innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId))
      .innerJoin(contexts, eq(contexts.id, finds.contextId))
      .innerJoin(trenches, eq(trenches.id, finds.trenchId))
      .where(eq(finds.boxId, box.id))
      .orderBy(asc(finds.number)),
    db
      .select({
        id: samples.id,
        number: samples.number,
        type: samples.type,
        contextNumber: contexts.number,
        trenchCode: trenches.code,
        status: samples.status,
      })
      .from(samples)
      .innerJoin(contexts, eq(contexts.id, samples.contextId))
      .innerJoin(trenches, eq(trenches.id, samples.trenchId))
      .where(eq(samples.boxId, box.id))
      .orderBy(asc(samples.number)),
  ]);
  return {
    ...box,
    finds: boxFinds,
    samples: boxSamples.map((s) => ({ ...s, typeLabel: sampleTypeLabels[s.type] })),
  };
}

export async function readBox(db: Db, siteId: string, boxId: string) {
  return boxContents(db, await getBox(db, siteId, boxId));
}

/**
 * Samples into a box (or out of it) or to a place in the store, all or nothing: a sample sent to a
 * specialist or discarded is not in a box, and the refusal names each such sample. One audit entry each.
 */
export async function storeSamples(db: Db, actor: SiteActor, input: SamplesStore) {
  const ids = [...new Set(input.sampleIds)];
  return db.transaction(async (tx) => {
    const box = input.boxId ? await boxInSite(tx, actor.site.id, input.boxId) : null;
    const rows = await tx
      .select()
      .from(samples)
      .where(and(eq(samples.siteId, actor.site.id), inArray(samples.id, ids)))
      .for("update");
    if (rows.length !== ids.length) {
      const missing = ids.length - rows.length;
      throw notFound(missing === 1 ? "One of the samples picked" : `${missing} of the samples picked`);
    }
    rows.sort((a, b) => a.number - b.number);
    if (box) {
      const away = rows.filter((r) => r.status === "sent" || r.status === "discarded");
      if (away.length)
        throw conflict(
          `No sample was stored: ${away.length === 1 ? "1 sample stops" : `${away.length} samples stop`} it. ${away
            .slice(0, 12)
            .map((r) => `sample ${r.number}: it is ${r.status === "sent" ? "with a specialist" : "discarded"}`)
            .join(" · ")}`,
          { refused: away.map((r) => ({ sampleId: r.id, number: r.number })) },
          "conflict",
        );
    }
    const after = await tx
      .update(samples)
      .set({
        ...(input.boxId !== undefined && { boxId: input.boxId }),
        ...(input.location !== undefined && { location: input.location }),
        updatedAt: new Date(),
      })
      .where(
        inArray(
          samples.id,
          rows.map((r) => r.id),
        ),
      )
      .returning();
    const byId = new Map(after.map((a) => [a.id, a]));
    for (const r of rows)
      await recordAudit(tx, {
        siteId: actor.site.id,
        actorId: actor.userId,
        action: "store",
        recordType: "sample",
        recordId: r.id,
        before: { boxId: r.boxId, location: r.location },
        after: {
          boxId: byId.get(r.id)?.boxId ?? null,
          location: byId.get(r.id)?.location ?? "",
          ...(box && { boxNumber: box.number }),
        },
      });
    return { changed: rows.length, numbers: rows.map((r) => r.number), boxNumber: box?.number ?? null };
  });
}

/** Every box the site has, for pickers: id, number and store. */
export async function boxChoices(db: Db, siteId: string) {
  return db
    .select({ id: boxes.id, number: boxes.number, store: boxes.store })
    .from(boxes)
    .where(eq(boxes.siteId, siteId))
    .orderBy(asc(boxes.number));
}
