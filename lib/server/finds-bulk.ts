import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { contexts, finds, trenches, type Context, type Find } from "@/db/schema";
import { checkOutline, distanceOutside } from "@/lib/geometry/outline";
import type { FindsBulk } from "@/lib/schemas/finds-bulk";
import { recordAudit } from "./audit";
import { processFinds } from "./find-processing";
import { getContext } from "./contexts";
import { PublicError, badInput, forbidden, notFound } from "./errors";
import { assertSiteClass } from "./artefact-classes";
import { photosHoldIt, photosOf } from "./attached-photos";
import { assertContextWritable } from "./locks";
import type { SiteActor } from "./membership";
import { getTrench } from "./trenches";

export type BulkRefusal = { findId: string; number: number; reason: string };

const verbs = { move: "moved", reclass: "re-classed", delete: "deleted", process: "changed" } as const;

/** The refusal of the whole edit, naming every find that stopped it and why. */
function refuseAll(action: FindsBulk["action"], refused: BulkRefusal[], status: 403 | 409 | 400 = 409): PublicError {
  const shown = refused.slice(0, 12).map((r) => `find ${r.number}: ${r.reason}`);
  const more = refused.length > shown.length ? ` … and ${refused.length - shown.length} more` : "";
  return new PublicError(
    status,
    `No find was ${verbs[action]}: ${refused.length === 1 ? "1 find stops" : `${refused.length} finds stop`} it. ${shown.join(" · ")}${more}`,
    undefined,
    { refused },
  );
}

/** The lock refusal of a context as one sentence, or null when it is open. */
async function lockReason(tx: Tx, context: Context): Promise<string | null> {
  try {
    await assertContextWritable(tx, context, "changed (nor its finds)");
    return null;
  } catch (err) {
    if (err instanceof PublicError) return err.message;
    throw err;
  }
}

/**
 * One change to many finds (moved to another context, re-classed, deleted with a reason), all or nothing: if
 * any find is locked, not this person's to change, outside the target trench or not on this site, nothing
 * changes and the refusal names each such find. Every find changed gets its own audit entry and a new version.
 * Processing and storage (`process`) come after the trench and follow their own rules (find-processing.ts).
 */
export async function bulkEditFinds(db: Db, actor: SiteActor, input: FindsBulk) {
  if ((input.action === "move" || input.action === "delete") && actor.role === "specialist") {
    throw forbidden(
      `A specialist may re-class finds but not ${input.action === "move" ? "move" : "delete"} them; it needs the role digger or director. Nothing was changed.`,
    );
  }
  const ids = [...new Set(input.findIds)];
  return db.transaction(async (tx) => {
    const rows = await tx
      .select()
      .from(finds)
      .where(and(eq(finds.siteId, actor.site.id), inArray(finds.id, ids)))
      .for("update");
    if (rows.length !== ids.length) {
      const found = new Set(rows.map((r) => r.id));
      const missing = ids.filter((id) => !found.has(id));
      throw notFound(
        `${missing.length === 1 ? "One of the finds picked" : `${missing.length} of the finds picked`} (${missing.slice(0, 5).join(", ")}${missing.length > 5 ? " …" : ""})`,
      );
    }
    rows.sort((a, b) => a.number - b.number);
    if (input.action === "process") return processFinds(tx, actor, input, rows);
    const refused: BulkRefusal[] = [];
    const ctxIds = [...new Set(rows.map((r) => r.contextId))];
    const ctxRows = await tx.select().from(contexts).where(inArray(contexts.id, ctxIds));
    const locked = new Map<string, string | null>();
    for (const c of ctxRows) locked.set(c.id, await lockReason(tx, c));
    for (const f of rows) {
      const reason = locked.get(f.contextId);
      if (reason) refused.push({ findId: f.id, number: f.number, reason });
    }
    if (input.action === "move") {
      const target = await getContext(tx, actor.site.id, input.contextId);
      const targetLock = await lockReason(tx, target);
      if (targetLock)
        throw new PublicError(
          409,
          `No find was moved: ${targetLock.replace("changed (nor its finds)", "given new finds")}`,
          { contextId: [`Context ${target.number} is not open.`] },
        );
      refused.push(...(await outsideTarget(tx, actor.site.id, target, rows)));
      for (const f of rows)
        if (f.spitId && f.contextId !== target.id)
          refused.push({
            findId: f.id,
            number: f.number,
            reason: "it was recorded in a spit of its context; move it on its own page and choose its spit there",
          });
    }
    if (input.action === "delete") {
      const pictured = await photosOf(tx, "find", ids);
      for (const f of rows) {
        const n = pictured.get(f.id);
        if (n) refused.push({ findId: f.id, number: f.number, reason: photosHoldIt(n) });
      }
    }
    if (input.action === "reclass") {
      await assertSiteClass(tx, actor.site.id, input.classId);
    }
    if (refused.length)
      throw refuseAll(
        input.action,
        refused.sort((a, b) => a.number - b.number),
      );
    return apply(tx, actor, input, rows);
  });
}

/**
 * The contexts the register's bulk bar offers as a move's target, by the move's own rules: open (not awaiting
 * sign-off, not signed off) and in a trench with a valid outline. Whether every find picked lies inside that
 * trench is still the move's to check: the register may not hold every picked find's position.
 */
export async function moveTargets(db: Db | Tx, siteId: string) {
  const rows = await db
    .select({
      id: contexts.id,
      number: contexts.number,
      trenchId: trenches.id,
      trenchCode: trenches.code,
      outline: trenches.outline,
    })
    .from(contexts)
    .innerJoin(trenches, eq(trenches.id, contexts.trenchId))
    .where(and(eq(contexts.siteId, siteId), eq(contexts.state, "open")))
    .orderBy(asc(trenches.code), asc(contexts.number));
  return rows.filter((r) => checkOutline(r.outline).ok).map(({ outline: _, ...r }) => r);
}

/** The finds that would lie outside the target context's trench, with the distance to its edge. */
async function outsideTarget(tx: Tx, siteId: string, target: Context, rows: Find[]): Promise<BulkRefusal[]> {
  const trench = await getTrench(tx, siteId, target.trenchId);
  const check = checkOutline(trench.outline);
  if (!check.ok) throw badInput(`Trench ${trench.code} has no valid outline yet: ${check.reason}`);
  const out: BulkRefusal[] = [];
  for (const f of rows) {
    const d = distanceOutside(check.window, f.x, f.y);
    if (d > 0)
      out.push({
        findId: f.id,
        number: f.number,
        reason: `it lies ${d.toFixed(3)} m outside trench ${trench.code}, where context ${target.number} is`,
      });
  }
  return out;
}

async function apply(tx: Tx, actor: SiteActor, input: Exclude<FindsBulk, { action: "process" }>, rows: Find[]) {
  const ids = rows.map((r) => r.id);
  const audit = (recordId: string, action: string, before: unknown, after?: unknown, reason?: string) =>
    recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action,
      recordType: "find",
      recordId,
      before,
      after,
      reason,
    });
  if (input.action === "delete") {
    await tx.delete(finds).where(inArray(finds.id, ids));
    for (const f of rows) await audit(f.id, "delete", f, undefined, input.reason);
    return { action: input.action, changed: rows.length, numbers: rows.map((r) => r.number) };
  }
  const set =
    input.action === "move"
      ? {
          contextId: input.contextId,
          trenchId: (await getContext(tx, actor.site.id, input.contextId)).trenchId,
          version: sql`${finds.version} + 1`,
          updatedAt: new Date(),
        }
      : { classId: input.classId, version: sql`${finds.version} + 1`, updatedAt: new Date() };
  const after = await tx.update(finds).set(set).where(inArray(finds.id, ids)).returning();
  const byId = new Map(after.map((a) => [a.id, a]));
  for (const f of rows) await audit(f.id, "update", f, byId.get(f.id));
  return { action: input.action, changed: rows.length, numbers: rows.map((r) => r.number) };
}
