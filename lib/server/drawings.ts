import "server-only";
import { and, asc, count, eq, inArray, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { Db, Tx } from "@/db/client";
import { contexts, drawingContexts, drawings, trenches, users, type Context } from "@/db/schema";
import { isUuid } from "@/lib/schemas/common";
import type { DrawingCreate, DrawingListQuery, DrawingUpdate } from "@/lib/schemas/drawing";
import { recordAudit } from "./audit";
import { badInput, notFound } from "./errors";
import { assertFieldRights } from "./field-rights";
import { assertContextWritable } from "./locks";
import { assertNamedMember, type SiteActor } from "./membership";
import { allocateRegisterNumber } from "./register-numbers";

/**
 * The drawing register (issue 15 item 3): plans and sections drawn on film or paper, numbered per site in
 * their own sequence without gaps, each showing one or more contexts of one trench. A drawing is locked
 * with its contexts: while any context it shows is submitted or signed off, it cannot change.
 */

async function getDrawing(tx: Db | Tx, siteId: string, drawingId: string) {
  if (!isUuid(drawingId)) throw notFound("That drawing");
  const [row] = await tx
    .select()
    .from(drawings)
    .where(and(eq(drawings.siteId, siteId), eq(drawings.id, drawingId)));
  if (!row) throw notFound("That drawing");
  return row;
}

async function shownContexts(tx: Db | Tx, drawingId: string): Promise<Context[]> {
  return tx
    .select({ c: contexts })
    .from(drawingContexts)
    .innerJoin(contexts, eq(contexts.id, drawingContexts.contextId))
    .where(eq(drawingContexts.drawingId, drawingId))
    .orderBy(asc(contexts.number))
    .then((rows) => rows.map((r) => r.c));
}

/** The contexts named, all of this site and of one trench; refused naming the field otherwise. */
async function contextsNamed(tx: Tx, siteId: string, ids: string[]): Promise<Context[]> {
  const wanted = [...new Set(ids)];
  const rows = await tx
    .select()
    .from(contexts)
    .where(and(eq(contexts.siteId, siteId), inArray(contexts.id, wanted)));
  if (rows.length !== wanted.length)
    throw badInput("One of the contexts picked is not on this site.", {
      contextIds: ["Pick contexts of this site."],
    });
  const trenchIds = new Set(rows.map((c) => c.trenchId));
  if (trenchIds.size > 1)
    throw badInput("A drawing shows contexts of one trench; draw another sheet for the other trench.", {
      contextIds: ["Pick contexts of one trench."],
    });
  return rows.sort((a, b) => a.number - b.number);
}

/** A drawing as the API answers: the stored row with the numbers of the contexts it shows. */
const withContexts = (row: typeof drawings.$inferSelect, shown: Context[]) => ({
  ...row,
  contextIds: shown.map((c) => c.id),
  contextNumbers: shown.map((c) => c.number),
});

const today = () => new Date().toISOString().slice(0, 10);

export async function createDrawing(db: Db, actor: SiteActor, input: DrawingCreate) {
  return db.transaction(async (tx) => {
    const shown = await contextsNamed(tx, actor.site.id, input.contextIds);
    for (const c of shown) await assertContextWritable(tx, c, "given new drawings");
    await assertNamedMember(tx, actor.site.id, input.drawnBy, "drawnBy", "who drew it");
    const number = await allocateRegisterNumber(tx, actor.site.id, "drawing");
    const [row] = await tx
      .insert(drawings)
      .values({
        siteId: actor.site.id,
        trenchId: shown[0]!.trenchId,
        number,
        kind: input.kind,
        scale: input.scale,
        title: input.title,
        drawnBy: input.drawnBy ?? actor.userId,
        drawnOn: input.drawnOn ?? today(),
        recordedBy: actor.userId,
      })
      .returning();
    await tx.insert(drawingContexts).values(shown.map((c) => ({ drawingId: row!.id, contextId: c.id })));
    const after = withContexts(row!, shown);
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "drawing",
      recordId: row!.id,
      after,
    });
    return after;
  });
}

export async function updateDrawing(db: Db, actor: SiteActor, drawingId: string, input: DrawingUpdate) {
  assertFieldRights("drawing", actor.role, input);
  return db.transaction(async (tx) => {
    const row = await getDrawing(tx, actor.site.id, drawingId);
    const was = await shownContexts(tx, row.id);
    for (const c of was) await assertContextWritable(tx, c, "changed (nor the drawings showing it)");
    const before = withContexts(row, was);
    if (!Object.keys(input).length) return before;
    let shown = was;
    if (input.contextIds) {
      shown = await contextsNamed(tx, actor.site.id, input.contextIds);
      const kept = new Set(was.map((c) => c.id));
      for (const c of shown) if (!kept.has(c.id)) await assertContextWritable(tx, c, "given new drawings");
      await tx.delete(drawingContexts).where(eq(drawingContexts.drawingId, row.id));
      await tx.insert(drawingContexts).values(shown.map((c) => ({ drawingId: row.id, contextId: c.id })));
    }
    await assertNamedMember(tx, actor.site.id, input.drawnBy, "drawnBy", "who drew it");
    const { contextIds: _ids, ...fields } = input;
    const [updated] = await tx
      .update(drawings)
      .set({ ...fields, trenchId: shown[0]!.trenchId, updatedAt: new Date() })
      .where(eq(drawings.id, row.id))
      .returning();
    const after = withContexts(updated!, shown);
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "drawing",
      recordId: row.id,
      before,
      after,
    });
    return after;
  });
}

/** Deleted with a stated reason (kept in the audit trail); the number is never handed out again. */
export async function deleteDrawing(db: Db, actor: SiteActor, drawingId: string, reason: string) {
  return db.transaction(async (tx) => {
    const row = await getDrawing(tx, actor.site.id, drawingId);
    const was = await shownContexts(tx, row.id);
    for (const c of was) await assertContextWritable(tx, c, "changed (nor the drawings showing it)");
    await tx.delete(drawings).where(eq(drawings.id, row.id));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "drawing",
      recordId: row.id,
      before: withContexts(row, was),
      reason,
    });
    return { deleted: row.id, number: row.number };
  });
}

const drawnByUser = alias(users, "drawn_by_user");

function drawingFilter(siteId: string, q: Omit<DrawingListQuery, "page" | "pageSize">): SQL | undefined {
  const where: SQL[] = [eq(drawings.siteId, siteId)];
  if (q.trenchId) where.push(eq(drawings.trenchId, q.trenchId));
  if (q.kind) where.push(eq(drawings.kind, q.kind));
  if (q.contextId)
    where.push(
      inArray(
        drawings.id,
        sql`(select ${drawingContexts.drawingId} from ${drawingContexts} where ${drawingContexts.contextId} = ${q.contextId})`,
      ),
    );
  return and(...where);
}

/** Register rows: each drawing with its trench, drawer, and the contexts it shows (numbers and states). */
async function registerRows(
  db: Db,
  siteId: string,
  q: Omit<DrawingListQuery, "page" | "pageSize">,
  page?: { limit: number; offset: number },
) {
  let query = db
    .select({
      id: drawings.id,
      number: drawings.number,
      kind: drawings.kind,
      scale: drawings.scale,
      title: drawings.title,
      drawnOn: drawings.drawnOn,
      drawnById: drawings.drawnBy,
      drawnBy: drawnByUser.name,
      trenchId: drawings.trenchId,
      trenchCode: trenches.code,
    })
    .from(drawings)
    .innerJoin(trenches, eq(trenches.id, drawings.trenchId))
    .leftJoin(drawnByUser, eq(drawnByUser.id, drawings.drawnBy))
    .where(drawingFilter(siteId, q))
    .orderBy(asc(drawings.number))
    .$dynamic();
  if (page) query = query.limit(page.limit).offset(page.offset);
  const rows = await query;
  const links = rows.length
    ? await db
        .select({ drawingId: drawingContexts.drawingId, number: contexts.number, state: contexts.state })
        .from(drawingContexts)
        .innerJoin(contexts, eq(contexts.id, drawingContexts.contextId))
        .where(
          inArray(
            drawingContexts.drawingId,
            rows.map((r) => r.id),
          ),
        )
        .orderBy(asc(contexts.number))
    : [];
  return rows.map((r) => {
    const shown = links.filter((l) => l.drawingId === r.id);
    // The drawing is final only when every context it shows is signed off.
    const state: "open" | "awaiting" | "signed_off" = shown.every((l) => l.state === "signed_off")
      ? "signed_off"
      : shown.some((l) => l.state === "open")
        ? "open"
        : "awaiting";
    return { ...r, contextNumbers: shown.map((l) => l.number), state };
  });
}

export type DrawingRegisterRow = Awaited<ReturnType<typeof registerRows>>[number];

export async function listDrawings(db: Db, siteId: string, q: DrawingListQuery) {
  const [rows, [total]] = await Promise.all([
    registerRows(db, siteId, q, { limit: q.pageSize, offset: (q.page - 1) * q.pageSize }),
    db.select({ n: count() }).from(drawings).where(drawingFilter(siteId, q)),
  ]);
  return { page: q.page, pageSize: q.pageSize, total: total?.n ?? 0, rows };
}

/** Every drawing the filters select (exports, the package). */
export async function allDrawings(db: Db, siteId: string, q: Omit<DrawingListQuery, "page" | "pageSize">) {
  return registerRows(db, siteId, q);
}
