import "server-only";
import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { analysisRuns } from "@/db/schema";
import { SpatialInputError } from "@/lib/spatial/errors";
import type { SimulationPool } from "@/lib/spatial/pool";
import { runDistributionTest } from "@/lib/spatial/run-test";
import { buildEngineSpec } from "./engine-spec";
import { adaptResult } from "./result-adapter";
import type { RunScope } from "./run-schema";
import type { RunParamsStored } from "./run-view";
import { markDone, markFailed, markRunning, writeProgress } from "./run-rows";
import { loadScope } from "./scope-data";

/** Progress is written at most this often (ms): often enough for a smooth bar, rarely enough for the database. */
const PROGRESS_EVERY_MS = 150;

export type ExecuteOptions = { signal: AbortSignal; pool: SimulationPool | null };

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
  try {
    const data = await loadScope(db, row.siteId, row.scope as RunScope);
    // The fingerprint is of the records actually read, which may have changed since the run was queued.
    if (!(await markRunning(db, runId, data.fingerprint))) return;
    const stop = new AbortController();
    const relay = () => stop.abort();
    options.signal.addEventListener("abort", relay, { once: true });
    if (options.signal.aborted) stop.abort();
    let lastWrite = 0;
    let writing: Promise<void> = Promise.resolve();
    const onProgress = (fraction: number) => {
      const now = Date.now();
      if (now - lastWrite < PROGRESS_EVERY_MS || fraction >= 1) return;
      lastWrite = now;
      writing = writing.then(async () => {
        if (!(await writeProgress(db, runId, fraction))) stop.abort();
      });
    };
    const finds = data.finds.map((f) => ({ x: f.x, y: f.y, classId: f.classId }));
    const { spec, entries } = buildEngineSpec({ window: data.window, classes: data.classes, finds, tests: params.tests, params, seed: row.seed });
    try {
      const engine = await runDistributionTest(spec, { onProgress, signal: stop.signal, pool: options.pool });
      await writing;
      if (stop.signal.aborted) return;
      const result = adaptResult({ engine, entries, window: data.window, classes: data.classes, finds, correction: params.correction, rmax: params.rmax, elapsedMs: Date.now() - started });
      await markDone(db, runId, result);
    } finally {
      options.signal.removeEventListener("abort", relay);
      await writing.catch(() => undefined);
    }
  } catch (err) {
    if (isAbort(err)) return; // the status already says cancelled (or the process is stopping)
    const message = err instanceof SpatialInputError ? err.message : "The run failed on the server; see the server log.";
    if (!(err instanceof SpatialInputError)) console.error(`[loamwork] run ${runId} failed`, err);
    await markFailed(db, runId, message);
  }
}

function isAbort(err: unknown): boolean {
  return (err instanceof Error || err instanceof DOMException) && (err as Error).name === "AbortError";
}
