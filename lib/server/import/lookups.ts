import "server-only";
import { and, eq, isNull, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { Db, Tx } from "@/db/client";
import {
  artefactClasses,
  contexts,
  finds,
  numberBlocks,
  numberVoids,
  samples,
  sites,
  trenches,
  users,
} from "@/db/schema";
import { checkOutline } from "@/lib/geometry/outline";
import type { Window } from "@/lib/spatial";

export type ImportContext = {
  id: string;
  number: number;
  trenchId: string;
  state: string;
  signedOffBy: string | null;
  signedOffAt: Date | null;
  submittedBy: string | null;
  submittedAt: Date | null;
};
/** A run of find numbers first..last, and the words that say whose or why. */
export type NumberRange = { first: number; last: number; words: string };

/** The range holding `n`, if any. */
export function rangeHolding(ranges: readonly NumberRange[] | undefined, n: number): NumberRange | undefined {
  return ranges?.find((r) => r.first <= n && n <= r.last);
}

/** A trench's plan window and its ground-surface level (RL), from which depths in a file are converted. */
export type TrenchWindow = { code: string; window: Window | null; problem?: string; surfaceLevel?: number | null };
/** A context's recorded top and base (RL): highest top and lowest base among its spot levels and spits. */
export type ContextRange = { top: number | null; base: number | null };

/** Everything a row is checked against, read once per file so 50,000 rows cost one pass in memory. */
export type ImportLookups = {
  classes: Map<string, string>;
  contexts: Map<number, ImportContext>;
  trenches: Map<string, TrenchWindow>;
  usedNumbers: Set<number>;
  nextNumber: number;
  /**
   * Find numbers a file may not bring, with why: blocks held by devices for recording offline (the number may
   * already be on a bag), void numbers, and samples' numbers where samples share the finds' sequence.
   */
  reservedNumbers?: NumberRange[];
  voidNumbers?: NumberRange[];
  sampleNumbers?: Set<number>;
  /** Recorded top and base per context id; a find outside them by more than `tolerance` is warned of. */
  levels?: Map<string, ContextRange>;
  tolerance?: number;
};

const submitter = alias(users, "submitter");

export async function loadImportLookups(db: Db | Tx, siteId: string): Promise<ImportLookups> {
  const [site] = await db
    .select({ next: sites.nextFindNumber, tolerance: sites.levelTolerance })
    .from(sites)
    .where(eq(sites.id, siteId));
  // One query after another: inside a transaction they share one connection (node-postgres queues
  // concurrent queries on a client, and warns that it will stop doing so).
  const cls = await db
    .select({ id: artefactClasses.id, code: artefactClasses.code })
    .from(artefactClasses)
    .where(eq(artefactClasses.siteId, siteId));
  const ctx = await db
    .select({
      id: contexts.id,
      number: contexts.number,
      trenchId: contexts.trenchId,
      state: contexts.state,
      signedOffBy: users.name,
      signedOffAt: contexts.signedOffAt,
      submittedBy: submitter.name,
      submittedAt: contexts.submittedAt,
    })
    .from(contexts)
    .leftJoin(users, eq(users.id, contexts.signedOffBy))
    .leftJoin(submitter, eq(submitter.id, contexts.submittedBy))
    .where(eq(contexts.siteId, siteId));
  const tr = await db
    .select({ id: trenches.id, code: trenches.code, outline: trenches.outline, surfaceLevel: trenches.surfaceLevel })
    .from(trenches)
    .where(eq(trenches.siteId, siteId));
  const levels = await contextRanges(db, siteId);
  const nums = await db.select({ n: finds.number }).from(finds).where(eq(finds.siteId, siteId));
  const held = await heldFindNumbers(db, siteId);
  const windows = new Map<string, TrenchWindow>();
  for (const t of tr) {
    // Each trench window is built once here, not once per row.
    const check = checkOutline(t.outline);
    windows.set(
      t.id,
      check.ok
        ? { code: t.code, window: check.window, surfaceLevel: t.surfaceLevel }
        : { code: t.code, window: null, problem: check.reason, surfaceLevel: t.surfaceLevel },
    );
  }
  return {
    classes: new Map(cls.map((c) => [c.code.toUpperCase(), c.id])),
    contexts: new Map(ctx.map((c) => [c.number, c])),
    trenches: windows,
    usedNumbers: new Set(nums.map((r) => r.n)),
    nextNumber: site?.next ?? 1,
    ...held,
    levels,
    tolerance: site?.tolerance ?? 0.005,
  };
}

/** The site's open find-number blocks (holder and device), void find numbers (reason), and shared sample numbers. */
async function heldFindNumbers(db: Db | Tx, siteId: string) {
  const blocks = await db
    .select({ first: numberBlocks.first, last: numberBlocks.last, name: users.name, device: numberBlocks.deviceLabel })
    .from(numberBlocks)
    .leftJoin(users, eq(users.id, numberBlocks.userId))
    .where(and(eq(numberBlocks.siteId, siteId), eq(numberBlocks.kind, "find"), isNull(numberBlocks.releasedAt)));
  const voids = await db
    .select({ first: numberVoids.first, last: numberVoids.last, reason: numberVoids.reason })
    .from(numberVoids)
    .where(and(eq(numberVoids.siteId, siteId), eq(numberVoids.kind, "find")));
  const [site] = await db.select({ shared: sites.samplesShareFindNumbers }).from(sites).where(eq(sites.id, siteId));
  const sampled = site?.shared
    ? await db.select({ n: samples.number }).from(samples).where(eq(samples.siteId, siteId))
    : [];
  return {
    reservedNumbers: blocks.map((b) => ({
      first: b.first,
      last: b.last,
      words: `${b.name ?? "another member"}${b.device ? ` on ${b.device}` : ""}`,
    })),
    voidNumbers: voids.map((v) => ({ first: v.first, last: v.last, words: v.reason })),
    sampleNumbers: new Set(sampled.map((r) => r.n)),
  };
}

/** Every context's recorded top and base on a site, from the spot levels taken on them and their spits. */
export async function contextRanges(
  db: Db | Tx,
  siteId: string,
  contextId?: string,
): Promise<Map<string, ContextRange>> {
  type Row = { id: string; top: number | string | null; base: number | string | null };
  const result = await db.execute(sql`
    with tops as (
      select s.target_id as context_id, s.level from spot_levels s where s.site_id = ${siteId} and s.target = 'context_top'
      union all select p.context_id, p.top_level from spits p where p.site_id = ${siteId} and p.top_level is not null
    ), bases as (
      select s.target_id as context_id, s.level from spot_levels s where s.site_id = ${siteId} and s.target = 'context_base'
      union all select p.context_id, p.base_level from spits p where p.site_id = ${siteId} and p.base_level is not null
    ), ranges as (
      select context_id, max(level) as top, null::double precision as base from tops group by context_id
      union all select context_id, null, min(level) from bases group by context_id
    )
    select context_id as id, max(top) as top, min(base) as base from ranges
    where ${contextId ?? null}::uuid is null or context_id = ${contextId ?? null}::uuid group by context_id`);
  const rows = (result as unknown as { rows: Row[] }).rows;
  const num = (v: number | string | null) => (v === null ? null : Number(v));
  return new Map(rows.map((r) => [r.id, { top: num(r.top), base: num(r.base) }]));
}
