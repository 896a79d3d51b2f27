import "server-only";
import { and, asc, eq, inArray, isNull } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import {
  artefactClasses,
  contexts,
  spits,
  squareCounts,
  squareSamples,
  type SquareSample,
  type Trench,
} from "@/db/schema";
import { checkOutline } from "@/lib/geometry/outline";
import {
  clipSquares,
  squareIndex,
  squareLabel,
  SquareGridError,
  type GridSquare,
  type SquareGridSpec,
} from "@/lib/geometry/square-grid";
import { isUuid } from "@/lib/schemas/common";
import type { SquareSampleInput } from "@/lib/schemas/squares";
import { recordAudit } from "./audit";
import { getContext } from "./contexts";
import { badInput, conflict, notFound } from "./errors";
import { assertContextWritable } from "./locks";
import type { SiteActor } from "./membership";
import { getTrench } from "./trenches";

/** Excavated areas may pass the clipped area by rounding only. */
const AREA_TOLERANCE = 1e-6;

/** The trench's square grid, or null when none was set. */
export function gridOf(trench: Pick<Trench, "squareSize" | "squareOriginX" | "squareOriginY">): SquareGridSpec | null {
  if (trench.squareSize == null) return null;
  return { size: trench.squareSize, originX: trench.squareOriginX ?? 0, originY: trench.squareOriginY ?? 0 };
}

/** The grid's squares clipped to the trench as it is drawn now; a grid that cannot be cut is refused on `field`. */
export function trenchSquares(
  trench: Pick<Trench, "code" | "outline">,
  grid: SquareGridSpec,
  field = "squareSize",
): GridSquare[] {
  const check = checkOutline(trench.outline);
  if (!check.ok)
    throw badInput(`Trench ${trench.code} has no valid outline (${check.reason}); its squares cannot be cut.`);
  try {
    return clipSquares(check.window, grid);
  } catch (err) {
    if (err instanceof SquareGridError) throw badInput(err.message, { [field]: [err.message] });
    throw err;
  }
}

function requireGrid(trench: Trench): SquareGridSpec {
  const grid = gridOf(trench);
  if (!grid)
    throw conflict(`Trench ${trench.code} has no square grid yet; a director sets its square size and origin first.`);
  return grid;
}

/**
 * A trench update that changes the square grid under recorded counts is refused: the counts were taken in
 * the old squares. Called by updateTrench inside its transaction; also checks the new grid cuts at all.
 */
export async function assertGridChange(
  tx: Tx,
  before: Trench,
  after: Pick<Trench, "code" | "outline" | "squareSize" | "squareOriginX" | "squareOriginY">,
): Promise<void> {
  const old = gridOf(before);
  const next = gridOf(after);
  const same =
    old && next ? old.size === next.size && old.originX === next.originX && old.originY === next.originY : old === next;
  if (!same) {
    const [held] = await tx
      .select({ id: squareSamples.id })
      .from(squareSamples)
      .where(eq(squareSamples.trenchId, before.id))
      .limit(1);
    if (held) {
      throw conflict(
        `Trench ${before.code} already has counts recorded by square; its grid cannot change under them. Delete those square records first.`,
      );
    }
  }
  if (next) trenchSquares(after, next);
}

export type SquareSampleView = SquareSample & {
  label: string;
  contextNumber: number;
  spitNumber: number | null;
  /** m² dug: the recorded area, or the square's whole clipped area; 0 when the square now lies outside the trench. */
  area: number;
  /** The outline was redrawn and this square no longer lies inside it: kept, but left out of maps and tests. */
  outside: boolean;
  counts: { classId: string; count: number; weightG: number | null }[];
};

export type TrenchSquares = {
  trenchId: string;
  grid: SquareGridSpec | null;
  squares: GridSquare[];
  samples: SquareSampleView[];
};

/** The trench's grid, its squares as clipped now, and every square record with its counts. */
export async function listTrenchSquares(db: Db | Tx, siteId: string, trenchId: string): Promise<TrenchSquares> {
  const trench = await getTrench(db, siteId, trenchId);
  const grid = gridOf(trench);
  if (!grid) return { trenchId, grid: null, squares: [], samples: [] };
  const squares = trenchSquares(trench, grid);
  const byIndex = squareIndex(squares);
  const rows = await db
    .select({ sample: squareSamples, contextNumber: contexts.number, spitNumber: spits.number })
    .from(squareSamples)
    .innerJoin(contexts, eq(contexts.id, squareSamples.contextId))
    .leftJoin(spits, eq(spits.id, squareSamples.spitId))
    .where(and(eq(squareSamples.siteId, siteId), eq(squareSamples.trenchId, trenchId)))
    .orderBy(asc(contexts.number), asc(spits.number), asc(squareSamples.row), asc(squareSamples.col));
  const ids = rows.map((r) => r.sample.id);
  const counts = ids.length ? await db.select().from(squareCounts).where(inArray(squareCounts.sampleId, ids)) : [];
  const countsOf = new Map<string, SquareSampleView["counts"]>();
  for (const c of counts)
    (countsOf.get(c.sampleId) ?? countsOf.set(c.sampleId, []).get(c.sampleId)!).push({
      classId: c.classId,
      count: c.count,
      weightG: c.weightG,
    });
  const samples = rows.map(({ sample, contextNumber, spitNumber }) => {
    const square = byIndex.get(`${sample.col},${sample.row}`);
    const area = square ? Math.min(sample.excavatedArea ?? square.area, square.area) : 0;
    return {
      ...sample,
      label: squareLabel(grid, sample.col, sample.row),
      contextNumber,
      spitNumber,
      area,
      outside: !square,
      counts: countsOf.get(sample.id) ?? [],
    };
  });
  return { trenchId, grid, squares, samples };
}

async function getSample(tx: Db | Tx, siteId: string, sampleId: string): Promise<SquareSample> {
  if (!isUuid(sampleId)) throw notFound("That square record");
  const [row] = await tx
    .select()
    .from(squareSamples)
    .where(and(eq(squareSamples.siteId, siteId), eq(squareSamples.id, sampleId)));
  if (!row) throw notFound("That square record");
  return row;
}

/** The checks a square record must pass against the trench, its context, spit and the site's classes. */
async function checkSample(tx: Tx, actor: SiteActor, trench: Trench, input: SquareSampleInput) {
  const grid = requireGrid(trench);
  const square = squareIndex(trenchSquares(trench, grid)).get(`${input.col},${input.row}`);
  const label = squareLabel(grid, input.col, input.row);
  if (!square)
    throw badInput(`Square ${label} lies outside trench ${trench.code}.`, {
      col: [`Square ${label} has no area inside the trench.`],
    });
  if (input.excavatedArea != null && input.excavatedArea > square.area + AREA_TOLERANCE) {
    const msg = `Square ${label} has ${+square.area.toFixed(4)} m² inside the trench; ${input.excavatedArea} m² cannot have been dug there.`;
    throw badInput(msg, { excavatedArea: [msg] });
  }
  const context = await getContext(tx, actor.site.id, input.contextId);
  if (context.trenchId !== trench.id)
    throw badInput(`Context ${context.number} is not in trench ${trench.code}.`, {
      contextId: ["That context is in another trench."],
    });
  if (input.spitId) {
    const [spit] = await tx
      .select()
      .from(spits)
      .where(and(eq(spits.id, input.spitId), eq(spits.contextId, context.id)));
    if (!spit)
      throw badInput(`That spit is not one of context ${context.number}'s.`, {
        spitId: ["Pick a spit of the chosen context."],
      });
  }
  const classIds = input.counts.map((c) => c.classId);
  const known = await tx
    .select({ id: artefactClasses.id })
    .from(artefactClasses)
    .where(and(eq(artefactClasses.siteId, actor.site.id), inArray(artefactClasses.id, classIds)));
  const knownIds = new Set(known.map((k) => k.id));
  const unknown = input.counts.findIndex((c) => !knownIds.has(c.classId));
  if (unknown >= 0)
    throw badInput("A class counted is not one of this site's classes.", {
      [`counts.${unknown}.classId`]: ["Not one of this site's classes."],
    });
  return { context, square, label };
}

/**
 * Records a square dug in a context (and spit) with its counts per class: a new record, or a replacement
 * of what that square held in that context and spit. Locked with its context; audited with before and after.
 */
export async function recordSquareSample(db: Db, actor: SiteActor, trenchId: string, input: SquareSampleInput) {
  return db.transaction(async (tx) => {
    const trench = await getTrench(tx, actor.site.id, trenchId);
    const { context, label } = await checkSample(tx, actor, trench, input);
    await assertContextWritable(tx, context, "given counts by square");
    const key = and(
      eq(squareSamples.contextId, context.id),
      input.spitId ? eq(squareSamples.spitId, input.spitId) : isNull(squareSamples.spitId),
      eq(squareSamples.col, input.col),
      eq(squareSamples.row, input.row),
    );
    const [old] = await tx.select().from(squareSamples).where(key);
    const before = old
      ? { ...old, counts: await tx.select().from(squareCounts).where(eq(squareCounts.sampleId, old.id)) }
      : null;
    const values = { excavatedArea: input.excavatedArea, recordedBy: actor.userId, updatedAt: new Date() };
    const [sample] = old
      ? await tx.update(squareSamples).set(values).where(eq(squareSamples.id, old.id)).returning()
      : await tx
          .insert(squareSamples)
          .values({
            ...values,
            siteId: actor.site.id,
            trenchId: trench.id,
            contextId: context.id,
            spitId: input.spitId,
            col: input.col,
            row: input.row,
          })
          .returning();
    if (old) await tx.delete(squareCounts).where(eq(squareCounts.sampleId, old.id));
    const counts = await tx
      .insert(squareCounts)
      .values(
        input.counts.map((c) => ({ sampleId: sample!.id, classId: c.classId, count: c.count, weightG: c.weightG })),
      )
      .returning();
    const after = { ...sample!, label, counts };
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: old ? "update" : "create",
      recordType: "square",
      recordId: sample!.id,
      before,
      after,
    });
    return after;
  });
}

/** Deletes a square record: the square goes back to not excavated in that context and spit. */
export async function deleteSquareSample(db: Db, actor: SiteActor, sampleId: string) {
  return db.transaction(async (tx) => {
    const before = await getSample(tx, actor.site.id, sampleId);
    const context = await getContext(tx, actor.site.id, before.contextId);
    await assertContextWritable(tx, context, "given changed counts by square");
    const counts = await tx.select().from(squareCounts).where(eq(squareCounts.sampleId, before.id));
    await tx.delete(squareSamples).where(eq(squareSamples.id, before.id));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "square",
      recordId: before.id,
      before: { ...before, counts },
    });
    return { deleted: before.id };
  });
}

/**
 * The square records of a trench or a context as a sign-off fingerprint takes them (sorted, stable keys).
 * Empty when there are none, so a trench without counts keeps the fingerprint it had before squares existed.
 */
export async function squareContent(tx: Db | Tx, where: { trenchId: string } | { contextId: string }) {
  const cond =
    "trenchId" in where ? eq(squareSamples.trenchId, where.trenchId) : eq(squareSamples.contextId, where.contextId);
  const rows = await tx
    .select({
      contextId: squareSamples.contextId,
      spitId: squareSamples.spitId,
      col: squareSamples.col,
      row: squareSamples.row,
      excavatedArea: squareSamples.excavatedArea,
      classId: squareCounts.classId,
      count: squareCounts.count,
      weightG: squareCounts.weightG,
    })
    .from(squareSamples)
    .innerJoin(squareCounts, eq(squareCounts.sampleId, squareSamples.id))
    .where(cond);
  const key = (r: (typeof rows)[number]) => `${r.contextId}|${r.spitId ?? ""}|${r.row}|${r.col}|${r.classId}`;
  return rows.sort((a, b) => (key(a) < key(b) ? -1 : key(a) > key(b) ? 1 : 0));
}
