import "server-only";
import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { analysisRuns } from "@/db/schema";
import { SpatialInputError, runDistributionTest, type SimulationPool } from "@/lib/spatial";
import { forgetRun, publishRun } from "../jobs/run-events";
import { buildEngineSpec } from "./engine-spec";
import { adaptResult } from "./result-adapter";
import type { RunScope } from "./run-schema";
import type { RunParamsStored } from "./run-view";
import { markDone, markFailed, markRunning, writeProgress } from "./run-rows";
import { loadScope, type ScopeData } from "./scope-data";

/**
 * Progress is written to the run's row at most this often (ms). A worker process's row is all its
 * watchers see, so it writes often enough for a smooth bar; a run in the app's own process also tells
 * its watchers directly (run-events.ts), so its row needs only enough for a reload to show roughly where
 * it is, and the database is left to the requests.
 */
const PROGRESS_EVERY_MS = { row: 150, live: 1000 };

export type ExecuteOptions = {
  signal: AbortSignal;
  pool: SimulationPool | null;
  /** Tell watchers in this process each change (the app's local queue); off in separate worker processes. */
  live?: boolean;
  /**
   * The records as the request that created the run read them, handed over when the run starts at once
   * in the same process; the run then computes on exactly what its fingerprint was taken of.
   */
  scope?: ScopeData;
};

/**
 * Executes one stored run: reads its records (this process holds the database; the worker threads get
 * plain arrays), runs the engine with progress and cancellation, stores the result or the reason it
 * failed. A run cancelled elsewhere is noticed at the next progress write and stopped.
 */
export async function executeRun(db: Db, runId: string, options: ExecuteOptions): Promise<void> {
  const [row] = await db.select().from(analysisRuns).where(eq(analysisRuns.id, runId));
  if (!row || (row.status !== "queued" && row.status !== "running")) return;
  const params = row.params as RunParamsStored;
  const started = Date.now();
  const live = options.live === true;
  try {
    // The fingerprint is of the records actually read, which may have changed since the run was queued.
    const data = options.scope ?? (await loadScope(db, row.siteId, row.scope as RunScope));
    const startedAt = new Date();
    if (!(await markRunning(db, runId, data.fingerprint, startedAt))) return;
    const startedIso = startedAt.toISOString();
    if (live) publishRun({ runId, status: "running", progress: 0, startedAt: startedIso });
    const stop = new AbortController();
    const relay = () => stop.abort();
    options.signal.addEventListener("abort", relay, { once: true });
    if (options.signal.aborted) stop.abort();
    let lastWrite = Date.now();
    let writing: Promise<void> = Promise.resolve();
    const every = live ? PROGRESS_EVERY_MS.live : PROGRESS_EVERY_MS.row;
    const onProgress = (fraction: number) => {
      if (fraction >= 1 || stop.signal.aborted) return;
      if (live) publishRun({ runId, status: "running", progress: fraction, startedAt: startedIso });
      const now = Date.now();
      if (now - lastWrite < every) return;
      lastWrite = now;
      writing = writing.then(async () => {
        if (!(await writeProgress(db, runId, fraction))) stop.abort();
      });
    };
    const finds = data.finds.map((f) => ({ x: f.x, y: f.y, classId: f.classId }));
    const { spec, entries } = buildEngineSpec({ window: data.window, classes: data.classes, finds, tests: params.tests, params, seed: row.seed });
    try {
      const engineStart = Date.now();
      const engine = await runDistributionTest(spec, { onProgress, signal: stop.signal, pool: options.pool, stored: true });
      const engineEnd = Date.now();
      await writing;
      if (stop.signal.aborted) return;
      const result = adaptResult({ engine, entries, window: data.window, classes: data.classes, finds, correction: params.correction, rmax: params.rmax, elapsedMs: Date.now() - started });
      result.timing = { engineStart, engineEnd };
      if ((await markDone(db, runId, result)) && live) publishRun({ runId, status: "done", progress: 1, startedAt: startedIso });
    } finally {
      options.signal.removeEventListener("abort", relay);
      await writing.catch(() => undefined);
    }
  } catch (err) {
    if (isAbort(err)) return; // the status already says cancelled (or the process is stopping)
    const message = err instanceof SpatialInputError ? err.message : "The run failed on the server; see the server log.";
    if (!(err instanceof SpatialInputError)) console.error(`[loamwork] run ${runId} failed`, err);
    await markFailed(db, runId, message);
    if (live) publishRun({ runId, status: "failed", progress: 0, startedAt: null });
  } finally {
    if (live) forgetRun(runId);
  }
}

function isAbort(err: unknown): boolean {
  return (err instanceof Error || err instanceof DOMException) && (err as Error).name === "AbortError";
}
