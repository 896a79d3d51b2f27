import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { contexts, finds, photos, trenches, type Trench } from "@/db/schema";
import { checkOutline, windowToPolygon, type OutlinePolygon } from "@/lib/geometry/outline";
import { isUuid } from "@/lib/schemas/common";
import type { TrenchCreate, TrenchUpdate } from "@/lib/schemas/trench";
import type { Window } from "@/lib/spatial";
import { recordAudit } from "./audit";
import { badInput, conflict, notFound } from "./errors";
import { assertContextsWritable, assertTrenchWritable } from "./locks";
import { assertFieldRights } from "./field-rights";
import type { SiteActor } from "./membership";
import { assertGridChange } from "./squares";
import { assertVersion, namesAField, nextVersion } from "./versions";
import { countOf } from "@/lib/words/count";
import { written } from "./written";

/** Validates an outline or refuses it with the reason, as a field error on `outline`. */
/** A valid polygon as a window, or a 400 naming the field (`outline` of a trench, `extent` of a context) and why. */
export function assertOutline(polygon: OutlinePolygon, field: "outline" | "extent" = "outline"): Window {
  const check = checkOutline(polygon);
  const what = field === "outline" ? "The trench outline" : "The context's extent";
  if (!check.ok) throw badInput(`${what} is not valid: ${check.reason}`, { [field]: [check.reason] });
  return check.window;
}

export async function listTrenches(db: Db, siteId: string) {
  return db.select().from(trenches).where(eq(trenches.siteId, siteId)).orderBy(asc(trenches.code));
}

/**
 * One trench of the site; `forUpdate` locks its row for the rest of the transaction (a sign-off committing at the same
 * moment is waited for).
 */
export async function getTrench(
  db: Db | Tx,
  siteId: string,
  trenchId: string,
  options: { forUpdate?: boolean } = {},
): Promise<Trench> {
  if (!isUuid(trenchId)) throw notFound("That trench");
  const query = db
    .select()
    .from(trenches)
    .where(and(eq(trenches.siteId, siteId), eq(trenches.id, trenchId)));
  const [row] = await (options.forUpdate ? query.for("update") : query);
  if (!row) throw notFound("That trench");
  return row;
}

export async function createTrench(db: Db, actor: SiteActor, input: TrenchCreate) {
  const window = assertOutline(input.outline);
  return db.transaction(async (tx) => {
    const [taken] = await tx
      .select({ id: trenches.id })
      .from(trenches)
      .where(and(eq(trenches.siteId, actor.site.id), eq(trenches.code, input.code)));
    if (taken) throw conflict(`Trench ${input.code} already exists on this site.`);
    const row = written(
      await tx
        .insert(trenches)
        .values({
          siteId: actor.site.id,
          code: input.code,
          name: input.name,
          outline: windowToPolygon(window),
          surfaceLevel: input.surfaceLevel ?? null,
        })
        .returning(),
      "The new trench",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "trench",
      recordId: row.id,
      after: row,
    });
    return row;
  });
}

export async function updateTrench(
  db: Db,
  actor: SiteActor,
  trenchId: string,
  input: TrenchUpdate,
  expectedVersion: number | null = null,
) {
  assertFieldRights("trench", actor.role, input);
  const window = input.outline ? assertOutline(input.outline) : null;
  return db.transaction(async (tx) => {
    const before = await getTrench(tx, actor.site.id, trenchId, { forUpdate: true });
    await assertTrenchWritable(tx, before, "changed");
    assertVersion(before, expectedVersion, `Trench ${before.code}`);
    if (window) {
      const placed = await tx
        .select({ number: finds.number, x: finds.x, y: finds.y, contextId: finds.contextId })
        .from(finds)
        .where(eq(finds.trenchId, trenchId));
      const outside = placed.filter((f) => !window.contains(f.x, f.y));
      if (outside.length) {
        // Finds of a locked context cannot be stranded at all: that refusal names who locked it and when.
        await assertContextsWritable(
          tx,
          outside.map((f) => f.contextId),
          "changed by moving the trench outline past its finds",
        );
        const names = outside
          .slice(0, 5)
          .map((f) => f.number)
          .join(", ");
        throw conflict(
          `The new outline would leave ${countOf(outside.length, "find")} outside the trench (find ${names}${outside.length > 5 ? ", …" : ""}). ` +
            "Move those finds first or draw the outline around them.",
          { outside: outside.map((f) => f.number) },
        );
      }
    }
    // The grid's squares are cut again from the new outline; a grid change under recorded counts is refused.
    const grid = {
      squareSize: input.squareSize,
      squareOriginX: input.squareOriginX,
      squareOriginY: input.squareOriginY,
    };
    const nextGrid = Object.fromEntries(Object.entries(grid).filter(([, v]) => v !== undefined));
    await assertGridChange(tx, before, {
      ...before,
      ...nextGrid,
      outline: window ? windowToPolygon(window) : before.outline,
    });
    if (input.code && input.code !== before.code) {
      const [taken] = await tx
        .select({ id: trenches.id })
        .from(trenches)
        .where(and(eq(trenches.siteId, actor.site.id), eq(trenches.code, input.code)));
      if (taken) throw conflict(`Trench ${input.code} already exists on this site.`);
    }
    const after = written(
      await tx
        .update(trenches)
        .set({
          ...(input.code !== undefined && { code: input.code }),
          ...(input.name !== undefined && { name: input.name }),
          ...(input.surfaceLevel !== undefined && { surfaceLevel: input.surfaceLevel }),
          ...(window && { outline: windowToPolygon(window) }),
          ...nextGrid,
          ...(namesAField(input) && { version: nextVersion(trenches.version) }),
          updatedAt: new Date(),
        })
        .where(eq(trenches.id, trenchId))
        .returning(),
      "The changed trench",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "trench",
      recordId: trenchId,
      before,
      after,
    });
    return after;
  });
}

export async function deleteTrench(db: Db, actor: SiteActor, trenchId: string, expectedVersion: number | null = null) {
  return db.transaction(async (tx) => {
    const before = await getTrench(tx, actor.site.id, trenchId, { forUpdate: true });
    await assertTrenchWritable(tx, before, "deleted");
    assertVersion(before, expectedVersion, `Trench ${before.code}`);
    const [ctx] = await tx.select({ id: contexts.id }).from(contexts).where(eq(contexts.trenchId, trenchId)).limit(1);
    if (ctx) throw conflict(`Trench ${before.code} still has contexts; a trench with records cannot be deleted.`);
    const [photo] = await tx
      .select({ number: photos.number })
      .from(photos)
      .where(and(eq(photos.trenchId, trenchId), eq(photos.kind, "record")))
      .limit(1);
    if (photo)
      throw conflict(
        `Trench ${before.code} has photo ${photo.number} in the photo register; a trench with records cannot be deleted.`,
      );
    await tx.delete(trenches).where(eq(trenches.id, trenchId));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "trench",
      recordId: trenchId,
      before,
    });
    return { deleted: trenchId };
  });
}
