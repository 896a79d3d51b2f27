import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import type { Db } from "@/db/client";
import { contexts, spits, spotLevels, trenches } from "@/db/schema";
import { listBenchmarks } from "../benchmarks";
import { listLevelRuns } from "../level-runs";
import { userNames } from "./user-names";

/**
 * What the level book screen shows and books against: the site's benchmarks, its runs with every reduced
 * level they gave, and the records a staff may stand on (contexts and their spits; finds are found by number).
 */
export async function loadLevelBook(db: Db, siteId: string) {
  const [marks, runs, sheets, slices] = await Promise.all([
    listBenchmarks(db, siteId),
    listLevelRuns(db, siteId),
    db
      .select({ id: contexts.id, number: contexts.number, state: contexts.state, trenchCode: trenches.code })
      .from(contexts)
      .innerJoin(trenches, eq(trenches.id, contexts.trenchId))
      .where(eq(contexts.siteId, siteId))
      .orderBy(asc(contexts.number)),
    db
      .select({ id: spits.id, number: spits.number, contextId: spits.contextId, contextNumber: contexts.number })
      .from(spits)
      .innerJoin(contexts, eq(contexts.id, spits.contextId))
      .where(eq(spits.siteId, siteId))
      .orderBy(asc(contexts.number), asc(spits.number)),
  ]);
  const ids = runs.map((r) => r.id);
  const levels = ids.length
    ? await db
        .select()
        .from(spotLevels)
        .where(and(eq(spotLevels.siteId, siteId), inArray(spotLevels.runId, ids)))
        .orderBy(asc(spotLevels.line))
    : [];
  const names = await userNames(
    db,
    runs.map((r) => r.recordedBy),
  );
  const code = new Map(marks.map((b) => [b.id, b.code]));
  const trenchCodes = new Map(
    (await db.select({ id: trenches.id, code: trenches.code }).from(trenches).where(eq(trenches.siteId, siteId))).map(
      (t) => [t.id, t.code],
    ),
  );
  return {
    benchmarks: marks,
    runs: runs.map((r) => ({
      id: r.id,
      takenOn: r.takenOn,
      trenchCode: r.trenchId ? (trenchCodes.get(r.trenchId) ?? null) : null,
      startCode: code.get(r.startBenchmarkId) ?? "?",
      closingCode: r.closingBenchmarkId ? (code.get(r.closingBenchmarkId) ?? "?") : null,
      tolerance: r.tolerance,
      misclosure: r.misclosure,
      withinTolerance: r.withinTolerance,
      recordedBy: r.recordedBy ? (names.get(r.recordedBy) ?? null) : null,
      lines: r.book.map((line, i) => {
        const spot = levels.find((l) => l.runId === r.id && l.line === i);
        return { ...line, level: spot?.level ?? null, flagged: spot?.flagged ?? false };
      }),
    })),
    contexts: sheets,
    spits: slices,
  };
}

export type LevelBookData = Awaited<ReturnType<typeof loadLevelBook>>;
