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
  spits,
  squareSamples,
  trenches,
  type ArtefactClass,
  type Context,
  type Spit,
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
  /** Reduced level (m above the site datum), or null when none was recorded. */
  z: number | null;
  spitId: string | null;
  updatedAt: Date;
};

/** The depth limits of a scope and what they left out. */
export type ScopeDepth = {
  levelFrom: number | null;
  levelTo: number | null;
  spits: Pick<Spit, "id" | "contextId" | "number" | "topLevel" | "baseLevel">[];
  /** Numbers of the finds of the chosen classes and contexts left out because they have no level (null). */
  noLevel: number[];
  /** Numbers of the finds left out because they were recorded in no spit, when spits are chosen. */
  noSpit: number[];
};

/** Everything a run reads, loaded once; the fingerprint is computed over exactly these records. */
export type ScopeData = {
  trench: Trench;
  window: Window;
  contexts: Context[];
  classes: ArtefactClass[];
  /**
   * Every find of the chosen classes in the chosen contexts: the pattern, the labelling pool, the "all finds"
   * background.
   */
  finds: ScopeFind[];
  /** Counts by grid square in the chosen contexts, for the square-count tests. */
  squareSamples: ScopeSquareSample[];
  /** Present when the scope is limited by level range or spits. */
  depth: ScopeDepth | null;
  fingerprint: string;
};

/** The depth limits as the loaders apply them: every spit of the chosen contexts by id, the chosen ones. */
type DepthFilter = {
  levelFrom: number | null;
  levelTo: number | null;
  spits: Map<string, Spit>;
  chosen: Set<string>;
};

/** True when the scope names a level bound or at least one spit. */
export function hasDepthLimit(scope: Pick<RunScope, "levelFrom" | "levelTo" | "spitIds">): boolean {
  return scope.levelFrom !== undefined || scope.levelTo !== undefined || (scope.spitIds?.length ?? 0) > 0;
}

/**
 * SHA-256 (FIPS 180-4) over the canonical JSON of the records a run reads: each find's id, number, x, y,
 * class, context and last change; the trench outline; the chosen contexts' state. Same records ⇒ same hash.
 */
export function fingerprintOf(
  trench: Pick<Trench, "id" | "outline"> & Partial<Pick<Trench, "squareSize" | "squareOriginX" | "squareOriginY">>,
  ctxs: Pick<Context, "id" | "number" | "state">[],
  rows: ScopeFind[],
  samples: ScopeSquareSample[] = [],
  depth: Pick<RunScope, "levelFrom" | "levelTo" | "spitIds"> = {},
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
  // The depth limits join the hash only where set, so runs on whole contexts keep their stored fingerprint.
  if (hasDepthLimit(depth))
    doc.depth = {
      levelFrom: depth.levelFrom ?? null,
      levelTo: depth.levelTo ?? null,
      spits: [...new Set(depth.spitIds ?? [])].sort(),
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
  depth: DepthFilter | null = null,
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
  const kept = depth ? rows.filter((r) => squareInDepth(r.spitId, depth)) : rows;
  if (!kept.length) return [];
  const counts = await db
    .select()
    .from(squareCounts)
    .where(
      and(
        inArray(
          squareCounts.sampleId,
          kept.map((r) => r.id),
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
  return kept.map((r) => ({ ...r, counts: bySample.get(r.id) ?? [] }));
}

/**
 * A square's counts are kept by a depth-limited scope when recorded in a chosen spit (if spits are chosen)
 * and, with a level range, when their spit lies wholly inside it; counts with no spit, or a spit without
 * both levels, cannot be placed in depth and are left out.
 */
function squareInDepth(spitId: string | null, depth: DepthFilter): boolean {
  if (depth.chosen.size && !depth.chosen.has(spitId ?? "")) return false;
  if (depth.levelFrom === null && depth.levelTo === null) return true;
  const spit = depth.spits.get(spitId ?? "");
  if (!spit || spit.topLevel === null || spit.baseLevel === null) return false;
  return (depth.levelFrom ?? -Infinity) <= spit.baseLevel && spit.topLevel <= (depth.levelTo ?? Infinity);
}

/** Whether a find lies inside the scope's depth limits, and if not, why. */
function findInDepth(f: ScopeFind, scope: RunScope): "in" | "out" | "no-level" | "no-spit" {
  const spitIds = scope.spitIds ?? [];
  if (spitIds.length) {
    if (f.spitId === null) return "no-spit";
    if (!spitIds.includes(f.spitId)) return "out";
  }
  if (scope.levelFrom === undefined && scope.levelTo === undefined) return "in";
  if (f.z === null) return "no-level";
  return (scope.levelFrom ?? -Infinity) <= f.z && f.z <= (scope.levelTo ?? Infinity) ? "in" : "out";
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
  const all = await db
    .select({
      id: finds.id,
      number: finds.number,
      x: finds.x,
      y: finds.y,
      classId: finds.classId,
      contextId: finds.contextId,
      z: finds.z,
      spitId: finds.spitId,
      updatedAt: finds.updatedAt,
    })
    .from(finds)
    .where(and(eq(finds.trenchId, trench.id), inArray(finds.contextId, contextIds), inArray(finds.classId, classIds)))
    .orderBy(asc(finds.number));
  const filter = hasDepthLimit(scope) ? await depthFilter(db, scope, contextIds) : null;
  let rows = all;
  let depth: ScopeDepth | null = null;
  if (filter) {
    const placed = all.map((f) => [f, findInDepth(f, scope)] as const);
    rows = placed.filter(([, p]) => p === "in").map(([f]) => f);
    depth = {
      levelFrom: filter.levelFrom,
      levelTo: filter.levelTo,
      spits: [...filter.chosen].map((sid) => {
        const { id: spitId, contextId, number, topLevel, baseLevel } = filter.spits.get(sid)!;
        return { id: spitId, contextId, number, topLevel, baseLevel };
      }),
      noLevel: placed.filter(([, p]) => p === "no-level").map(([f]) => f.number),
      noSpit: placed.filter(([, p]) => p === "no-spit").map(([f]) => f.number),
    };
  }
  const samples = await loadSquareSamples(db, trench.id, contextIds, classIds, filter);
  return {
    trench,
    window: check.window,
    contexts: ctxs,
    classes,
    finds: rows,
    squareSamples: samples,
    depth,
    fingerprint: fingerprintOf(trench, ctxs, rows, samples, scope),
  };
}

/** The spits of the chosen contexts; every chosen spit must be one of them. */
async function depthFilter(db: Db | Tx, scope: RunScope, contextIds: string[]): Promise<DepthFilter> {
  const rows = await db
    .select()
    .from(spits)
    .where(inArray(spits.contextId, contextIds))
    .orderBy(asc(spits.contextId), asc(spits.number));
  const byId = new Map(rows.map((s) => [s.id, s]));
  const chosen = new Set(scope.spitIds ?? []);
  if ([...chosen].some((sid) => !byId.has(sid)))
    throw badInput("Some chosen spits are not spits of the chosen contexts.", {
      "scope.spitIds": ["Choose spits of the chosen contexts."],
    });
  return { levelFrom: scope.levelFrom ?? null, levelTo: scope.levelTo ?? null, spits: byId, chosen };
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
