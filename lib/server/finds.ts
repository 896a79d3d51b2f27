import "server-only";
import { levelOutsideContext } from "@/lib/levels/context-range";
import { contextRanges } from "./import/lookups";
import { and, asc, desc, eq, gt, gte, ilike, inArray, lte, or, sql, type SQL } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { artefactClasses, boxes, contexts, finds, trenches, users, type Find } from "@/db/schema";
import { isUuid } from "@/lib/schemas/common";
import type { FindCreate, FindListQuery, FindUpdate } from "@/lib/schemas/find";
import { checkOutline, distanceOutside } from "@/lib/geometry/outline";
import { recordAudit } from "./audit";
import { PublicError, badInput, conflict, notFound } from "./errors";
import { assertSiteClass } from "./artefact-classes";
import { photosHoldIt, photosOf } from "./attached-photos";
import { allocateFindNumbers } from "./find-numbers";
import { assertContextWritable } from "./locks";
import { assertFieldRights } from "./field-rights";
import type { SiteActor } from "./membership";
import { getContext } from "./contexts";
import { getTrench } from "./trenches";
import { assertFindNumberHeld, voidDeletedNumber } from "./number-blocks";
import { assertVersion, namesAField, nextVersion } from "./versions";
import { written } from "./written";

export async function getFind(db: Db | Tx, siteId: string, findId: string): Promise<Find> {
  if (!isUuid(findId)) throw notFound("That find");
  const [row] = await db
    .select()
    .from(finds)
    .where(and(eq(finds.siteId, siteId), eq(finds.id, findId)));
  if (!row) throw notFound("That find");
  return row;
}

/** Refuses a position outside the trench outline, with the distance to the edge. */
export async function assertInsideTrench(tx: Db | Tx, siteId: string, trenchId: string, x: number, y: number) {
  const trench = await getTrench(tx, siteId, trenchId);
  const check = checkOutline(trench.outline);
  if (!check.ok) throw badInput(`Trench ${trench.code} has no valid outline yet: ${check.reason}`);
  const d = distanceOutside(check.window, x, y);
  if (d > 0) {
    const msg = `(${x.toFixed(3)}, ${y.toFixed(3)}) lies ${d.toFixed(3)} m outside the outline of trench ${trench.code}.`;
    throw new PublicError(
      400,
      `The find is outside its trench: ${msg}`,
      { x: [msg], y: [msg] },
      { distance: d },
      "outside-trench",
    );
  }
  return trench;
}

/** A warning (never a refusal) when the find's level lies outside its context's recorded top and base. */
async function levelWarning(
  tx: Tx,
  actor: SiteActor,
  context: { id: string; number: number },
  z: number | null,
): Promise<string | null> {
  if (z === null) return null;
  const ranges = await contextRanges(tx, actor.site.id, context.id);
  const outside = levelOutsideContext(z, ranges.get(context.id), actor.site.levelTolerance, context.number);
  return outside ? `Find saved, but check its level: ${outside}.` : null;
}

export async function createFind(db: Db, actor: SiteActor, input: FindCreate) {
  return db.transaction(async (tx) => {
    const context = await getContext(tx, actor.site.id, input.contextId);
    await assertContextWritable(tx, context, "given new finds");
    await assertSiteClass(tx, actor.site.id, input.classId);
    await assertInsideTrench(tx, actor.site.id, context.trenchId, input.x, input.y);
    // A number sent with the find was taken from a block the sender holds (recorded offline); else the next one.
    if (input.number !== undefined) await assertFindNumberHeld(tx, actor, input.number);
    const number = input.number ?? (await allocateFindNumbers(tx, actor.site.id));
    const row = written(
      await tx
        .insert(finds)
        .values({
          ...input,
          z: input.z ?? null,
          count: input.count ?? null,
          weightG: input.weightG ?? null,
          siteId: actor.site.id,
          trenchId: context.trenchId,
          number,
          recordedBy: actor.userId,
        })
        .returning(),
      "The new find",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "find",
      recordId: row.id,
      after: row,
    });
    return { ...row, levelWarning: await levelWarning(tx, actor, context, row.z) };
  });
}

export async function updateFind(
  db: Db,
  actor: SiteActor,
  findId: string,
  input: FindUpdate,
  expectedVersion: number | null = null,
) {
  assertFieldRights("find", actor.role, input);
  return db.transaction(async (tx) => {
    const before = await getFind(tx, actor.site.id, findId);
    const from = await getContext(tx, actor.site.id, before.contextId);
    await assertContextWritable(tx, from, "changed (nor its finds)");
    assertVersion(before, expectedVersion, `Find ${before.number}`);
    let trenchId = before.trenchId;
    if (input.contextId && input.contextId !== before.contextId) {
      const to = await getContext(tx, actor.site.id, input.contextId);
      await assertContextWritable(tx, to, "given new finds");
      trenchId = to.trenchId;
    }
    if (input.classId) await assertSiteClass(tx, actor.site.id, input.classId);
    await assertInsideTrench(tx, actor.site.id, trenchId, input.x ?? before.x, input.y ?? before.y);
    const [after] = await tx
      .update(finds)
      .set({
        ...input,
        trenchId,
        updatedAt: new Date(),
        ...(namesAField(input) && { version: nextVersion(finds.version) }),
      })
      .where(eq(finds.id, findId))
      .returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "find",
      recordId: findId,
      before,
      after,
    });
    const context = after!.contextId === from.id ? from : await getContext(tx, actor.site.id, after!.contextId);
    return { ...after!, levelWarning: await levelWarning(tx, actor, context, after!.z) };
  });
}

export async function deleteFind(db: Db, actor: SiteActor, findId: string, expectedVersion: number | null = null) {
  return db.transaction(async (tx) => {
    const before = await getFind(tx, actor.site.id, findId);
    const context = await getContext(tx, actor.site.id, before.contextId);
    await assertContextWritable(tx, context, "changed (nor its finds)");
    assertVersion(before, expectedVersion, `Find ${before.number}`);
    const pictured = (await photosOf(tx, "find", [findId])).get(findId);
    if (pictured) throw conflict(`Find ${before.number} was not deleted: ${photosHoldIt(pictured)}.`);
    await tx.delete(finds).where(eq(finds.id, findId));
    await voidDeletedNumber(tx, actor.site.id, "find", before.number, before.recordedBy, actor.userId, "find deleted");
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "find",
      recordId: findId,
      before,
    });
    return { deleted: findId, number: before.number };
  });
}

const sortColumns = {
  number: finds.number,
  recordedAt: finds.recordedAt,
  trench: trenches.code,
  context: contexts.number,
  class: artefactClasses.code,
  recorder: users.name,
  x: finds.x,
  y: finds.y,
  z: finds.z,
} as const;

/** The register's filters without paging: what the register shows and what its export writes. */
export type FindFilters = Omit<FindListQuery, "page" | "pageSize">;

function registerFilter(siteId: string, q: FindFilters): SQL | undefined {
  const where: SQL[] = [eq(finds.siteId, siteId)];
  if (q.trenchId) where.push(eq(finds.trenchId, q.trenchId));
  if (q.contextId) where.push(eq(finds.contextId, q.contextId));
  if (q.classId) where.push(eq(finds.classId, q.classId));
  if (q.recordedBy) where.push(eq(finds.recordedBy, q.recordedBy));
  if (q.from) where.push(gte(finds.recordedAt, q.from));
  // A bare date as the end of the range means "through that day".
  if (q.to) where.push(lte(finds.recordedAt, endOfDay(q.to)));
  if (q.q) {
    const term = `%${q.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    // Class words are matched in the small class table first, so each find is tested once, not per join.
    const classHit = sql`${finds.classId} in (select ${artefactClasses.id} from ${artefactClasses} where ${artefactClasses.siteId} = ${siteId} and (${artefactClasses.label} ilike ${term} or ${artefactClasses.code} ilike ${term}))`;
    const numberHit = /^\d{1,9}$/.test(q.q) ? eq(finds.number, Number(q.q)) : undefined;
    const text = or(ilike(finds.description, term), classHit, numberHit);
    if (text) where.push(text);
  }
  return and(...where);
}

const endOfDay = (d: Date) =>
  d.getUTCHours() === 0 && d.getUTCMinutes() === 0 && d.getUTCSeconds() === 0 ? new Date(d.getTime() + 86_399_999) : d;

const sortOrder = (q: FindFilters) => (q.dir === "desc" ? desc(sortColumns[q.sort]) : asc(sortColumns[q.sort]));

function registerQuery(db: Db, siteId: string, q: FindFilters) {
  const order = sortOrder(q);
  return db
    .select({
      id: finds.id,
      number: finds.number,
      stationPoint: finds.stationPoint,
      x: finds.x,
      y: finds.y,
      z: finds.z,
      count: finds.count,
      weightG: finds.weightG,
      description: finds.description,
      method: finds.method,
      recordedAt: finds.recordedAt,
      version: finds.version,
      recordedBy: users.name,
      recordedById: finds.recordedBy,
      trenchId: finds.trenchId,
      trenchCode: trenches.code,
      contextId: finds.contextId,
      contextNumber: contexts.number,
      contextState: contexts.state,
      classId: finds.classId,
      classCode: artefactClasses.code,
      classLabel: artefactClasses.label,
      classColour: artefactClasses.colour,
      classSymbol: artefactClasses.symbol,
      processing: finds.processing,
      sentTo: finds.sentTo,
      boxNumber: boxes.number,
      location: finds.location,
    })
    .from(finds)
    .innerJoin(contexts, eq(contexts.id, finds.contextId))
    .innerJoin(trenches, eq(trenches.id, finds.trenchId))
    .innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId))
    .leftJoin(users, eq(users.id, finds.recordedBy))
    .leftJoin(boxes, eq(boxes.id, finds.boxId))
    .where(registerFilter(siteId, q))
    .orderBy(order, asc(finds.number))
    .$dynamic();
}

export type RegisterRow = Awaited<ReturnType<typeof registerQuery>>[number];

/** One page of the finds register, filtered, sorted and counted in the database. */
export async function listFinds(db: Db, siteId: string, q: FindListQuery) {
  const filter = registerFilter(siteId, q);
  // Sort and cut the page on the finds table alone (joining only what the sort needs), then dress the
  // 50 rows of the page: the joins no longer run over every matching find.
  let ids = db.select({ id: finds.id }).from(finds).$dynamic();
  if (q.sort === "context") ids = ids.innerJoin(contexts, eq(contexts.id, finds.contextId));
  if (q.sort === "class") ids = ids.innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId));
  if (q.sort === "trench") ids = ids.innerJoin(trenches, eq(trenches.id, finds.trenchId));
  if (q.sort === "recorder") ids = ids.leftJoin(users, eq(users.id, finds.recordedBy));
  const [pageIds, total] = await Promise.all([
    ids
      .where(filter)
      .orderBy(sortOrder(q), asc(finds.number))
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize),
    countFinds(db, filter),
  ]);
  const rows = pageIds.length
    ? await registerQuery(db, siteId, q).where(
        inArray(
          finds.id,
          pageIds.map((r) => r.id),
        ),
      )
    : [];
  return { page: q.page, pageSize: q.pageSize, total, rows };
}

/** Every find the filters select, in the register's order (for exports). */
export async function allFinds(db: Db, siteId: string, q: FindFilters): Promise<RegisterRow[]> {
  return registerQuery(db, siteId, q);
}

/**
 * Every find the filters select, by number, a page at a time: an export of a whole site holds one page of
 * rows, never all of them.
 */
export async function* findsByNumber(
  db: Db,
  siteId: string,
  q: Omit<FindFilters, "sort" | "dir">,
  pageSize = 2000,
): AsyncGenerator<RegisterRow[]> {
  const filters: FindFilters = { ...q, sort: "number", dir: "asc" };
  for (let after = 0; ;) {
    const rows = await registerQuery(db, siteId, filters)
      .where(and(registerFilter(siteId, filters), gt(finds.number, after)))
      .limit(pageSize);
    if (rows.length) yield rows;
    if (rows.length < pageSize) return;
    after = rows[rows.length - 1]!.number;
  }
}

/**
 * The ids of every find the register's filters select, in number order, up to `limit` (a bulk edit's most):
 * what "select all that match" picks.
 */
export async function findIdsMatching(db: Db, siteId: string, q: FindFilters, limit: number) {
  const filter = registerFilter(siteId, q);
  const [rows, total] = await Promise.all([
    db.select({ id: finds.id }).from(finds).where(filter).orderBy(asc(finds.number)).limit(limit),
    countFinds(db, filter),
  ]);
  return { total, ids: rows.map((r) => r.id), truncated: total > rows.length };
}

async function countFinds(db: Db, filter: SQL | undefined): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(finds)
    .where(filter);
  return row?.n ?? 0;
}
