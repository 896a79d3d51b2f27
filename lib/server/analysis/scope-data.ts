import "server-only";
import { createHash } from "node:crypto";
import { and, asc, eq, inArray } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import {
  artefactClasses,
  contextRelations,
  contexts,
  finds,
  squareCounts,
  squareSamples,
  trenches,
  type ArtefactClass,
  type Context,
  type Trench,
} from "@/db/schema";
import { checkOutline } from "@/lib/geometry/outline";
import type { Window } from "@/lib/spatial";
import { badInput, notFound } from "../errors";
import { canonicalJson } from "./canonical-json";
import type { RunScope } from "@/lib/schemas/run";

/** A square record of a chosen context (any spit), with its counts of the chosen classes. */
export type ScopeSquareSample = {
  id: string;
  col: number;
  row: number;
  contextId: string;
  spitId: string | null;
  excavatedArea: number | null;
  updatedAt: Date;
  counts: { classId: string; count: number; weightG: number | null }[];
};

export type ScopeFind = {
  id: string;
  number: number;
  x: number;
  y: number;
  classId: string;
  contextId: string;
  updatedAt: Date;
};

/** Everything a run reads, loaded once; the fingerprint is computed over exactly these records. */
export type ScopeData = {
  trench: Trench;
  window: Window;
  contexts: Context[];
  classes: ArtefactClass[];
  /** Every find of the chosen classes in the chosen contexts: the pattern, the labelling pool, the "all finds" background. */
  finds: ScopeFind[];
  /** Counts by grid square in the chosen contexts, for the square-count tests. */
  squareSamples: ScopeSquareSample[];
  fingerprint: string;
};

/**
 * SHA-256 (FIPS 180-4) over the canonical JSON of the records a run reads: each find's id, number, x, y,
 * class, context and last change; the trench outline; the chosen contexts' state. Same records ⇒ same hash.
 */
export function fingerprintOf(
  trench: Pick<Trench, "id" | "outline"> & Partial<Pick<Trench, "squareSize" | "squareOriginX" | "squareOriginY">>,
  ctxs: Pick<Context, "id" | "number" | "state">[],
  rows: ScopeFind[],
  samples: ScopeSquareSample[] = [],
): string {
  const doc: Record<string, unknown> = {
    trench: { id: trench.id, outline: trench.outline.coordinates },
    contexts: [...ctxs]
      .sort((a, b) => a.number - b.number)
      .map((c) => ({ id: c.id, number: c.number, state: c.state })),
    finds: [...rows]
      .sort((a, b) => a.number - b.number)
      .map((f) => ({
        id: f.id,
        number: f.number,
        x: f.x,
        y: f.y,
        class: f.classId,
        context: f.contextId,
        updatedAt: f.updatedAt,
      })),
  };
  // Counts by square join the hash only where there are some, so that runs on scopes without them keep
  // the fingerprint they were stored with.
  if (samples.length) {
    doc.squares = {
      grid: [trench.squareSize ?? null, trench.squareOriginX ?? null, trench.squareOriginY ?? null],
      samples: [...samples]
        .sort((a, b) => a.id.localeCompare(b.id))
        .map((q) => ({
          id: q.id,
          col: q.col,
          row: q.row,
          context: q.contextId,
          spit: q.spitId,
          area: q.excavatedArea,
          updatedAt: q.updatedAt,
          counts: [...q.counts].sort((a, b) => a.classId.localeCompare(b.classId)),
        })),
    };
  }
  return createHash("sha256").update(canonicalJson(doc)).digest("hex");
}

async function loadSquareSamples(
  db: Db | Tx,
  trenchId: string,
  contextIds: string[],
  classIds: string[],
): Promise<ScopeSquareSample[]> {
  const rows = await db
    .select({
      id: squareSamples.id,
      col: squareSamples.col,
      row: squareSamples.row,
      contextId: squareSamples.contextId,
      spitId: squareSamples.spitId,
      excavatedArea: squareSamples.excavatedArea,
      updatedAt: squareSamples.updatedAt,
    })
    .from(squareSamples)
    .where(and(eq(squareSamples.trenchId, trenchId), inArray(squareSamples.contextId, contextIds)))
    .orderBy(asc(squareSamples.row), asc(squareSamples.col));
  if (!rows.length) return [];
  const counts = await db
    .select()
    .from(squareCounts)
    .where(
      and(
        inArray(
          squareCounts.sampleId,
          rows.map((r) => r.id),
        ),
        inArray(squareCounts.classId, classIds),
      ),
    );
  const bySample = new Map<string, ScopeSquareSample["counts"]>();
  for (const c of counts)
    (bySample.get(c.sampleId) ?? bySample.set(c.sampleId, []).get(c.sampleId)!).push({
      classId: c.classId,
      count: c.count,
      weightG: c.weightG,
    });
  return rows.map((r) => ({ ...r, counts: bySample.get(r.id) ?? [] }));
}

export async function loadScope(db: Db | Tx, siteId: string, scope: RunScope): Promise<ScopeData> {
  const [trench] = await db
    .select()
    .from(trenches)
    .where(and(eq(trenches.siteId, siteId), eq(trenches.id, scope.trenchId)));
  if (!trench) throw notFound("That trench");
  const check = checkOutline(trench.outline);
  if (!check.ok) throw badInput(`Trench ${trench.code}'s outline cannot serve as the study area: ${check.reason}`);
  const contextIds = [...new Set(scope.contextIds)];
  const ctxs = await db
    .select()
    .from(contexts)
    .where(and(eq(contexts.trenchId, trench.id), inArray(contexts.id, contextIds)))
    .orderBy(asc(contexts.number));
  if (ctxs.length !== contextIds.length)
    throw badInput(`Some chosen contexts are not in trench ${trench.code}.`, {
      "scope.contextIds": ["Choose contexts of this trench."],
    });
  const classIds = [...new Set(scope.classIds)];
  const classes = await db
    .select()
    .from(artefactClasses)
    .where(and(eq(artefactClasses.siteId, siteId), inArray(artefactClasses.id, classIds)))
    .orderBy(asc(artefactClasses.code));
  if (classes.length !== classIds.length)
    throw badInput("Some chosen classes are not classes of this site.", {
      "scope.classIds": ["Choose classes of this site."],
    });
  const rows = await db
    .select({
      id: finds.id,
      number: finds.number,
      x: finds.x,
      y: finds.y,
      classId: finds.classId,
      contextId: finds.contextId,
      updatedAt: finds.updatedAt,
    })
    .from(finds)
    .where(and(eq(finds.trenchId, trench.id), inArray(finds.contextId, contextIds), inArray(finds.classId, classIds)))
    .orderBy(asc(finds.number));
  const samples = await loadSquareSamples(db, trench.id, contextIds, classIds);
  return {
    trench,
    window: check.window,
    contexts: ctxs,
    classes,
    finds: rows,
    squareSamples: samples,
    fingerprint: fingerprintOf(trench, ctxs, rows, samples),
  };
}

/** The current fingerprint of a stored scope, or null when its records are gone (deleted trench or context). */
export async function currentFingerprint(db: Db | Tx, siteId: string, scope: RunScope): Promise<string | null> {
  try {
    return (await loadScope(db, siteId, scope)).fingerprint;
  } catch {
    return null;
  }
}

export async function siteRelations(db: Db | Tx, siteId: string) {
  return db
    .select({ fromId: contextRelations.fromId, toId: contextRelations.toId, kind: contextRelations.kind })
    .from(contextRelations)
    .where(eq(contextRelations.siteId, siteId));
}
