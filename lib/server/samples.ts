import "server-only";
import { and, asc, count, eq, inArray, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { Db, Tx } from "@/db/client";
import { boxes, contexts, samples, sites, spits, trenches, users, type Context, type Sample } from "@/db/schema";
import { checkOutline, distanceOutside } from "@/lib/geometry/outline";
import { isUuid } from "@/lib/schemas/common";
import type { SampleCreate, SampleListQuery, SampleUpdate } from "@/lib/schemas/sample";
import type { SampleStatus } from "@/lib/schemas/sample";
import { recordAudit } from "./audit";
import { getContext } from "./contexts";
import { badInput, notFound } from "./errors";
import { assertFieldRights } from "./field-rights";
import { assertContextWritable } from "./locks";
import { assertNamedMember, type SiteActor } from "./membership";
import { voidDeletedNumber } from "./number-blocks";
import { allocateSampleNumber } from "./sample-numbers";
import { getTrench } from "./trenches";

/** One sample with its spit's number. */
export async function readSample(db: Db | Tx, siteId: string, sampleId: string) {
  return withSpitNumber(db, await getSample(db, siteId, sampleId));
}

export async function getSample(db: Db | Tx, siteId: string, sampleId: string): Promise<Sample> {
  if (!isUuid(sampleId)) throw notFound("That sample");
  const [row] = await db
    .select()
    .from(samples)
    .where(and(eq(samples.siteId, siteId), eq(samples.id, sampleId)));
  if (!row) throw notFound("That sample");
  return row;
}

/** The spit of that number in the sample's context (its id), or null when the sample was not taken by spit. */
async function spitOf(tx: Tx, context: Context, spit: number | null | undefined): Promise<string | null> {
  if (spit === null || spit === undefined) return null;
  const [row] = await tx
    .select({ id: spits.id })
    .from(spits)
    .where(and(eq(spits.contextId, context.id), eq(spits.number, spit)));
  if (!row)
    throw badInput(`Context ${context.number} has no spit ${spit}; add the spit on the context sheet first.`, {
      spit: [`Context ${context.number} has no spit ${spit}.`],
    });
  return row.id;
}

/** A sample as the API shows it: the spit by its number within the context. */
async function withSpitNumber(tx: Db | Tx, row: Sample) {
  if (!row.spitId) return { ...row, spit: null };
  const [s] = await tx.select({ number: spits.number }).from(spits).where(eq(spits.id, row.spitId));
  return { ...row, spit: s?.number ?? null };
}

/** A plotted sample lies inside its trench's outline, like a find. */
async function assertPositionInside(tx: Tx, siteId: string, trenchId: string, x: number | null, y: number | null) {
  if (x === null || y === null) return;
  const trench = await getTrench(tx, siteId, trenchId);
  const check = checkOutline(trench.outline);
  if (!check.ok) throw badInput(`Trench ${trench.code} has no valid outline yet: ${check.reason}`);
  const d = distanceOutside(check.window, x, y);
  if (d > 0) {
    const msg = `(${x.toFixed(3)}, ${y.toFixed(3)}) lies ${d.toFixed(3)} m outside the outline of trench ${trench.code}.`;
    throw badInput(`The sample is outside its trench: ${msg}`, { x: [msg], y: [msg] }, { distance: d });
  }
}

const today = () => new Date().toISOString().slice(0, 10);

export async function createSample(db: Db, actor: SiteActor, input: SampleCreate) {
  return db.transaction(async (tx) => {
    const context = await getContext(tx, actor.site.id, input.contextId);
    await assertContextWritable(tx, context, "given new samples");
    const spitId = await spitOf(tx, context, input.spit);
    await assertNamedMember(tx, actor.site.id, input.takenBy, "takenBy", "who took the sample");
    await assertPositionInside(tx, actor.site.id, context.trenchId, input.x ?? null, input.y ?? null);
    const number = await allocateSampleNumber(tx, actor.site.id);
    const [row] = await tx
      .insert(samples)
      .values({
        siteId: actor.site.id,
        trenchId: context.trenchId,
        contextId: context.id,
        spitId,
        number,
        type: input.type,
        x: input.x ?? null,
        y: input.y ?? null,
        z: input.z ?? null,
        volumeL: input.volumeL ?? null,
        purpose: input.purpose,
        takenBy: input.takenBy ?? actor.userId,
        takenOn: input.takenOn ?? today(),
        recordedBy: actor.userId,
      })
      .returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "sample",
      recordId: row!.id,
      after: row,
    });
    return withSpitNumber(tx, row!);
  });
}

export async function updateSample(db: Db, actor: SiteActor, sampleId: string, input: SampleUpdate) {
  assertFieldRights("sample", actor.role, input);
  return db.transaction(async (tx) => {
    const before = await getSample(tx, actor.site.id, sampleId);
    const from = await getContext(tx, actor.site.id, before.contextId);
    await assertContextWritable(tx, from, "changed (nor its samples)");
    if (!Object.keys(input).length) return withSpitNumber(tx, before);
    let to = from;
    if (input.contextId && input.contextId !== before.contextId) {
      to = await getContext(tx, actor.site.id, input.contextId);
      await assertContextWritable(tx, to, "given new samples");
    }
    // The spit keeps its number when the sample moves: that spit must exist in the new context too.
    const { spit } = await withSpitNumber(tx, before);
    const spitId = await spitOf(tx, to, input.spit === undefined ? spit : input.spit);
    await assertNamedMember(tx, actor.site.id, input.takenBy, "takenBy", "who took the sample");
    const x = input.x === undefined ? before.x : input.x;
    const y = input.y === undefined ? before.y : input.y;
    if ((x === null) !== (y === null))
      throw badInput("Give both x and y, or neither.", {
        [x === null ? "x" : "y"]: ["Give both x and y, or neither."],
      });
    await assertPositionInside(tx, actor.site.id, to.trenchId, x, y);
    const { spit: _spit, ...fields } = input;
    const [after] = await tx
      .update(samples)
      .set({ ...fields, spitId, trenchId: to.trenchId, updatedAt: new Date() })
      .where(eq(samples.id, before.id))
      .returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "sample",
      recordId: before.id,
      before,
      after,
    });
    return withSpitNumber(tx, after!);
  });
}

/**
 * Deleted with a stated reason (kept in the audit trail); the number is never handed out again. Where samples
 * share the finds' sequence the number is void in that sequence's accounting, as a deleted find's is: it was
 * handed out, so it must not read as never handed out.
 */
export async function deleteSample(db: Db, actor: SiteActor, sampleId: string, reason: string) {
  return db.transaction(async (tx) => {
    const before = await getSample(tx, actor.site.id, sampleId);
    const context = await getContext(tx, actor.site.id, before.contextId);
    await assertContextWritable(tx, context, "changed (nor its samples)");
    await tx.delete(samples).where(eq(samples.id, before.id));
    const [site] = await tx
      .select({ shared: sites.samplesShareFindNumbers })
      .from(sites)
      .where(eq(sites.id, actor.site.id));
    if (site?.shared)
      await voidDeletedNumber(
        tx,
        actor.site.id,
        "find",
        before.number,
        before.recordedBy,
        actor.userId,
        `sample deleted: ${reason}`,
      );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "sample",
      recordId: before.id,
      before,
      reason,
    });
    return { deleted: before.id, number: before.number };
  });
}

/**
 * Post-excavation status of many samples at once (flotation done, sent to a specialist). Processing comes
 * after the trench, so it is not locked with the context; every sample must be this site's, or nothing
 * changes. One audit entry per sample whose status changed.
 */
export async function setSampleStatus(db: Db, actor: SiteActor, sampleIds: string[], status: SampleStatus) {
  const ids = [...new Set(sampleIds)];
  return db.transaction(async (tx) => {
    const rows = await tx
      .select()
      .from(samples)
      .where(and(eq(samples.siteId, actor.site.id), inArray(samples.id, ids)))
      .for("update");
    if (rows.length !== ids.length) {
      const found = new Set(rows.map((r) => r.id));
      const missing = ids.filter((id) => !found.has(id));
      throw notFound(
        `${missing.length === 1 ? "One of the samples" : `${missing.length} of the samples`} (${missing.slice(0, 5).join(", ")}${missing.length > 5 ? " …" : ""})`,
      );
    }
    const changed = rows.filter((r) => r.status !== status);
    if (changed.length) {
      await tx
        .update(samples)
        .set({ status, updatedAt: new Date() })
        .where(
          inArray(
            samples.id,
            changed.map((r) => r.id),
          ),
        );
      for (const r of changed) {
        await recordAudit(tx, {
          siteId: actor.site.id,
          actorId: actor.userId,
          action: "status",
          recordType: "sample",
          recordId: r.id,
          before: { status: r.status },
          after: { status },
        });
      }
    }
    return { changed: changed.length, status };
  });
}

const takenByUser = alias(users, "taken_by_user");

function sampleFilter(siteId: string, q: Omit<SampleListQuery, "page" | "pageSize">): SQL | undefined {
  const where: SQL[] = [eq(samples.siteId, siteId)];
  if (q.trenchId) where.push(eq(samples.trenchId, q.trenchId));
  if (q.contextId) where.push(eq(samples.contextId, q.contextId));
  if (q.type) where.push(eq(samples.type, q.type));
  if (q.status) where.push(eq(samples.status, q.status));
  return and(...where);
}

function registerQuery(db: Db, siteId: string, q: Omit<SampleListQuery, "page" | "pageSize">) {
  return db
    .select({
      id: samples.id,
      number: samples.number,
      type: samples.type,
      status: samples.status,
      x: samples.x,
      y: samples.y,
      z: samples.z,
      volumeL: samples.volumeL,
      purpose: samples.purpose,
      takenOn: samples.takenOn,
      takenById: samples.takenBy,
      takenBy: takenByUser.name,
      trenchId: samples.trenchId,
      trenchCode: trenches.code,
      contextId: samples.contextId,
      contextNumber: contexts.number,
      contextState: contexts.state,
      spitId: samples.spitId,
      spitNumber: spits.number,
      boxNumber: boxes.number,
      location: samples.location,
    })
    .from(samples)
    .innerJoin(contexts, eq(contexts.id, samples.contextId))
    .innerJoin(trenches, eq(trenches.id, samples.trenchId))
    .leftJoin(spits, eq(spits.id, samples.spitId))
    .leftJoin(takenByUser, eq(takenByUser.id, samples.takenBy))
    .leftJoin(boxes, eq(boxes.id, samples.boxId))
    .where(sampleFilter(siteId, q))
    .orderBy(asc(samples.number))
    .$dynamic();
}

export type SampleRegisterRow = Awaited<ReturnType<typeof registerQuery>>[number];

/** One page of the samples register, in number order. */
export async function listSamples(db: Db, siteId: string, q: SampleListQuery) {
  const [rows, [total]] = await Promise.all([
    registerQuery(db, siteId, q)
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize),
    db.select({ n: count() }).from(samples).where(sampleFilter(siteId, q)),
  ]);
  return { page: q.page, pageSize: q.pageSize, total: total?.n ?? 0, rows };
}

/** Every sample the filters select (exports, labels). */
export async function allSamples(
  db: Db,
  siteId: string,
  q: Omit<SampleListQuery, "page" | "pageSize">,
): Promise<SampleRegisterRow[]> {
  return registerQuery(db, siteId, q);
}

/** A site's samples, to refuse changing its numbering once any exists. */
export async function countSamples(db: Db | Tx, siteId: string): Promise<number> {
  const [row] = await db.select({ n: count() }).from(samples).where(eq(samples.siteId, siteId));
  return row?.n ?? 0;
}
