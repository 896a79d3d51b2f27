import "server-only";
import { and, asc, eq, or } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { benchmarks, levelRuns, sites, type Benchmark } from "@/db/schema";
import type { BenchmarkCreate, BenchmarkUpdate, DatumUpdate } from "@/lib/schemas/levels";
import { recordAudit } from "./audit";
import { conflict, notFound } from "./errors";
import { assertFieldRights } from "./field-rights";
import type { SiteActor } from "./membership";

/** The site's height reference: what every reduced level in Loamwork is measured from. */
export async function updateDatum(db: Db, actor: SiteActor, input: DatumUpdate) {
  assertFieldRights("datum", actor.role, input);
  return db.transaction(async (tx) => {
    const [before] = await tx.select().from(sites).where(eq(sites.id, actor.site.id)).for("update");
    if (!before) throw notFound("That site");
    const pick = (s: typeof before) => ({
      datumKind: s.datumKind,
      datumName: s.datumName,
      levelTolerance: s.levelTolerance,
    });
    // An update that names no field changes nothing (and writes no audit entry).
    if (!Object.keys(input).length) return pick(before);
    const [after] = await tx.update(sites).set(input).where(eq(sites.id, actor.site.id)).returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "datum",
      recordId: actor.site.id,
      before: pick(before),
      after: pick(after!),
    });
    return pick(after!);
  });
}

export async function listBenchmarks(db: Db | Tx, siteId: string): Promise<Benchmark[]> {
  return db.select().from(benchmarks).where(eq(benchmarks.siteId, siteId)).orderBy(asc(benchmarks.code));
}

export async function getBenchmark(db: Db | Tx, siteId: string, benchmarkId: string): Promise<Benchmark> {
  const [row] = await db
    .select()
    .from(benchmarks)
    .where(and(eq(benchmarks.siteId, siteId), eq(benchmarks.id, benchmarkId)));
  if (!row) throw notFound("That benchmark");
  return row;
}

async function assertCodeFree(tx: Tx, siteId: string, code: string, except?: string) {
  const [taken] = await tx
    .select({ id: benchmarks.id })
    .from(benchmarks)
    .where(and(eq(benchmarks.siteId, siteId), eq(benchmarks.code, code)));
  if (taken && taken.id !== except) throw conflict(`Benchmark ${code} already exists on this site.`);
}

/** A benchmark used by a levelling run keeps its level: the run's reduced levels were worked from it. */
async function assertUnused(tx: Tx, benchmark: Benchmark, doing: string) {
  const [used] = await tx
    .select({ id: levelRuns.id })
    .from(levelRuns)
    .where(or(eq(levelRuns.startBenchmarkId, benchmark.id), eq(levelRuns.closingBenchmarkId, benchmark.id)))
    .limit(1);
  if (used) throw conflict(`Benchmark ${benchmark.code} cannot be ${doing}: levelling runs were reduced from it.`);
}

export async function createBenchmark(db: Db, actor: SiteActor, input: BenchmarkCreate) {
  return db.transaction(async (tx) => {
    await assertCodeFree(tx, actor.site.id, input.code);
    const [row] = await tx
      .insert(benchmarks)
      .values({ ...input, siteId: actor.site.id, createdBy: actor.userId })
      .returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "benchmark",
      recordId: row!.id,
      after: row,
    });
    return row!;
  });
}

export async function updateBenchmark(db: Db, actor: SiteActor, benchmarkId: string, input: BenchmarkUpdate) {
  assertFieldRights("benchmark", actor.role, input);
  return db.transaction(async (tx) => {
    const before = await getBenchmark(tx, actor.site.id, benchmarkId);
    // An update that names no field changes nothing (and writes no audit entry).
    if (!Object.keys(input).length) return before;
    if (input.level !== undefined && input.level !== before.level) await assertUnused(tx, before, "given a new level");
    if (input.code !== undefined) await assertCodeFree(tx, actor.site.id, input.code, before.id);
    const [after] = await tx.update(benchmarks).set(input).where(eq(benchmarks.id, before.id)).returning();
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "benchmark",
      recordId: before.id,
      before,
      after,
    });
    return after!;
  });
}

export async function deleteBenchmark(db: Db, actor: SiteActor, benchmarkId: string) {
  return db.transaction(async (tx) => {
    const before = await getBenchmark(tx, actor.site.id, benchmarkId);
    await assertUnused(tx, before, "deleted");
    await tx.delete(benchmarks).where(eq(benchmarks.id, before.id));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "benchmark",
      recordId: before.id,
      before,
    });
    return { deleted: before.id };
  });
}
