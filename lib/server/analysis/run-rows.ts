import "server-only";
import { and, eq, inArray, sql } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { analysisRuns, type AnalysisRun } from "@/db/schema";
import type { RunResult } from "@/lib/api/run-result";

/**
 * Status writes of a run. Each transition names the status it expects, so a run cancelled meanwhile is
 * never flipped back to running or done (the update then matches no row and the caller learns it).
 */
export async function markRunning(
  db: Db | Tx,
  runId: string,
  fingerprint: string,
  startedAt = new Date(),
): Promise<boolean> {
  const rows = await db
    .update(analysisRuns)
    .set({ status: "running", progress: 0, startedAt, error: null, fingerprint })
    .where(and(eq(analysisRuns.id, runId), inArray(analysisRuns.status, ["queued", "running"])))
    .returning({ id: analysisRuns.id });
  return rows.length === 1;
}

/** Writes progress; false when the run is no longer running (cancelled from elsewhere). */
export async function writeProgress(db: Db | Tx, runId: string, progress: number): Promise<boolean> {
  const rows = await db
    .update(analysisRuns)
    .set({ progress: Math.max(0, Math.min(1, progress)) })
    .where(and(eq(analysisRuns.id, runId), eq(analysisRuns.status, "running")))
    .returning({ id: analysisRuns.id });
  return rows.length === 1;
}

export async function markDone(db: Db | Tx, runId: string, result: RunResult): Promise<boolean> {
  const rows = await db
    .update(analysisRuns)
    .set({ status: "done", progress: 1, result: result as unknown as Record<string, unknown>, finishedAt: new Date() })
    .where(and(eq(analysisRuns.id, runId), eq(analysisRuns.status, "running")))
    .returning({ id: analysisRuns.id });
  return rows.length === 1;
}

export async function markFailed(db: Db | Tx, runId: string, message: string): Promise<void> {
  await db
    .update(analysisRuns)
    .set({ status: "failed", error: message, finishedAt: new Date() })
    .where(and(eq(analysisRuns.id, runId), inArray(analysisRuns.status, ["queued", "running"])));
}

export async function markCancelled(db: Db | Tx, runId: string): Promise<AnalysisRun | null> {
  const [row] = await db
    .update(analysisRuns)
    .set({ status: "cancelled", finishedAt: new Date() })
    .where(and(eq(analysisRuns.id, runId), inArray(analysisRuns.status, ["queued", "running"])))
    .returning();
  return row ?? null;
}

/** Runs left 'running' by a process that stopped: back to the queue (the embedded database has one process). */
export async function requeueOrphans(db: Db): Promise<string[]> {
  await db
    .update(analysisRuns)
    .set({ status: "queued", progress: 0, startedAt: null })
    .where(eq(analysisRuns.status, "running"));
  const rows = await db
    .select({ id: analysisRuns.id })
    .from(analysisRuns)
    .where(eq(analysisRuns.status, "queued"))
    .orderBy(analysisRuns.createdAt);
  return rows.map((r) => r.id);
}

/** Runs 'running' since before `cutoff` in a shared database: their worker is gone, so they fail visibly. */
export async function failStale(db: Db, cutoff: Date): Promise<number> {
  const rows = await db
    .update(analysisRuns)
    .set({ status: "failed", error: "The worker running this run stopped; start it again.", finishedAt: new Date() })
    .where(and(eq(analysisRuns.status, "running"), sql`${analysisRuns.startedAt} < ${cutoff.toISOString()}`))
    .returning({ id: analysisRuns.id });
  return rows.length;
}
