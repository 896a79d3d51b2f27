import "server-only";
import { and, asc, desc, eq, inArray } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { contexts, finds, levelRuns, spits, spotLevels, type LevelBookLine } from "@/db/schema";
import { LevelBookError, reduceLevelRun } from "@/lib/levels/levelling";
import type { LevelRunCreate } from "@/lib/schemas/levels";
import { recordAudit } from "./audit";
import { badInput, notFound } from "./errors";
import { assertContextWritable } from "./locks";
import type { SiteActor } from "./membership";
import { getBenchmark } from "./benchmarks";
import { getTrench } from "./trenches";
import { nextVersion } from "./versions";

type Line = LevelRunCreate["lines"][number];

const lineError = (index: number, field: string, message: string) =>
  badInput(`Line ${index + 1} of the level book: ${message}`, { [`lines.${index}.${field}`]: [message] });

/** What each line's level is taken on must be a record of this site that may still change. */
async function checkTargets(tx: Tx, actor: SiteActor, lines: readonly Line[]) {
  const siteId = actor.site.id;
  for (const [i, line] of lines.entries()) {
    const needsId = ["find", "context_top", "context_base", "spit_top", "spit_base", "benchmark"].includes(line.target);
    if (needsId && !line.targetId)
      throw lineError(i, "targetId", `say which ${line.target.replace("_", " ")} the staff stood on.`);
    if (!needsId && line.targetId)
      throw lineError(i, "targetId", `a ${line.target.replace("_", " ")} is not a record; leave the record empty.`);
    if (!line.targetId) continue;
    let contextId: string | null = null;
    if (line.target === "find") {
      const [f] = await tx
        .select({ contextId: finds.contextId })
        .from(finds)
        .where(and(eq(finds.siteId, siteId), eq(finds.id, line.targetId)));
      if (!f) throw lineError(i, "targetId", "that find is not on this site.");
      contextId = f.contextId;
    } else if (line.target === "spit_top" || line.target === "spit_base") {
      const [s] = await tx
        .select({ contextId: spits.contextId })
        .from(spits)
        .where(and(eq(spits.siteId, siteId), eq(spits.id, line.targetId)));
      if (!s) throw lineError(i, "targetId", "that spit is not on this site.");
      contextId = s.contextId;
    } else if (line.target === "context_top" || line.target === "context_base") {
      contextId = line.targetId;
    } else if (line.target === "benchmark") {
      await getBenchmark(tx, siteId, line.targetId).catch(() => {
        throw lineError(i, "targetId", "that benchmark is not on this site.");
      });
    }
    if (contextId) {
      const [c] = await tx
        .select()
        .from(contexts)
        .where(and(eq(contexts.siteId, siteId), eq(contexts.id, contextId)));
      if (!c) throw lineError(i, "targetId", "that context is not on this site.");
      await assertContextWritable(tx, c, "given new levels");
    }
  }
}

/**
 * Books a levelling run: reduces it (height-of-instrument method), keeps every reduced level as a spot level
 * of what it was taken on, and writes the levels of finds and spits. A run that closes outside the site's
 * tolerance is kept and its levels flagged, never hidden. All or nothing.
 */
export async function recordLevelRun(db: Db, actor: SiteActor, input: LevelRunCreate) {
  return db.transaction(async (tx) => {
    const start = await getBenchmark(tx, actor.site.id, input.startBenchmarkId);
    const closing = input.closingBenchmarkId ? await getBenchmark(tx, actor.site.id, input.closingBenchmarkId) : null;
    if (input.trenchId) await getTrench(tx, actor.site.id, input.trenchId);
    const lines = input.lines;
    const first = lines[0]!;
    if (first.target !== "benchmark" || (first.targetId && first.targetId !== start.id)) {
      throw lineError(0, "target", `the first line is the backsight on the starting benchmark ${start.code}.`);
    }
    lines[0] = { ...first, targetId: start.id };
    if (closing) {
      const last = lines[lines.length - 1]!;
      if (last.target !== "benchmark" || (last.targetId && last.targetId !== closing.id)) {
        throw lineError(lines.length - 1, "target", `a run closed on ${closing.code} ends with a foresight on it.`);
      }
      lines[lines.length - 1] = { ...last, targetId: closing.id };
    }
    await checkTargets(tx, actor, lines);
    let reduced;
    try {
      reduced = reduceLevelRun({
        startLevel: start.level,
        rows: lines,
        closingLevel: closing?.level ?? null,
        tolerance: actor.site.levelTolerance,
      });
    } catch (err) {
      if (err instanceof LevelBookError)
        throw err.row === null
          ? badInput(err.message)
          : lineError(err.row, "station", err.message.replace(/^Line \d+[^:]*: /, ""));
      throw err;
    }
    const book: LevelBookLine[] = lines.map((l) => ({
      station: l.station,
      target: l.target,
      targetId: l.targetId,
      backsight: l.backsight,
      intermediate: l.intermediate,
      foresight: l.foresight,
    }));
    const [run] = await tx
      .insert(levelRuns)
      .values({
        siteId: actor.site.id,
        trenchId: input.trenchId ?? null,
        takenOn: input.takenOn,
        startBenchmarkId: start.id,
        closingBenchmarkId: closing?.id ?? null,
        book,
        tolerance: actor.site.levelTolerance,
        misclosure: reduced.misclosure,
        withinTolerance: reduced.withinTolerance,
        recordedBy: actor.userId,
      })
      .returning();
    const flagged = reduced.withinTolerance === false;
    const spots = reduced.rows.map((r, i) => ({
      siteId: actor.site.id,
      runId: run!.id,
      line: i,
      target: lines[i]!.target,
      targetId: lines[i]!.targetId,
      station: r.station,
      level: r.level,
      flagged,
    }));
    await tx.insert(spotLevels).values(spots);
    for (const spot of spots) {
      if (spot.target === "find" && spot.targetId) {
        const [before] = await tx.select().from(finds).where(eq(finds.id, spot.targetId));
        const [after] = await tx
          .update(finds)
          .set({ z: spot.level, updatedAt: new Date(), version: nextVersion(finds.version) })
          .where(eq(finds.id, spot.targetId))
          .returning();
        await recordAudit(tx, {
          siteId: actor.site.id,
          actorId: actor.userId,
          action: "level",
          recordType: "find",
          recordId: spot.targetId,
          before: { z: before?.z ?? null },
          after: { z: after?.z ?? null, runId: run!.id, flagged },
        });
      } else if ((spot.target === "spit_top" || spot.target === "spit_base") && spot.targetId) {
        const column = spot.target === "spit_top" ? { topLevel: spot.level } : { baseLevel: spot.level };
        await tx.update(spits).set(column).where(eq(spits.id, spot.targetId));
      }
    }
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "level_run",
      recordId: run!.id,
      after: { ...run, levels: spots.length },
    });
    return {
      ...run!,
      levels: reduced.rows,
      sumBacksights: reduced.sumBacksights,
      sumForesights: reduced.sumForesights,
      rise: reduced.rise,
    };
  });
}

export async function listLevelRuns(db: Db, siteId: string) {
  return db
    .select()
    .from(levelRuns)
    .where(eq(levelRuns.siteId, siteId))
    .orderBy(desc(levelRuns.takenOn), desc(levelRuns.createdAt));
}

export async function getLevelRun(db: Db, siteId: string, runId: string) {
  const [run] = await db
    .select()
    .from(levelRuns)
    .where(and(eq(levelRuns.siteId, siteId), eq(levelRuns.id, runId)));
  if (!run) throw notFound("That levelling run");
  const levels = await db.select().from(spotLevels).where(eq(spotLevels.runId, run.id)).orderBy(asc(spotLevels.line));
  return { ...run, levels };
}

/** Spot levels taken on a context's top and base (several each), flagged ones included. */
export async function contextSpotLevels(db: Db | Tx, siteId: string, contextId: string) {
  return db
    .select()
    .from(spotLevels)
    .where(
      and(
        eq(spotLevels.siteId, siteId),
        eq(spotLevels.targetId, contextId),
        inArray(spotLevels.target, ["context_top", "context_base"]),
      ),
    )
    .orderBy(asc(spotLevels.level));
}
