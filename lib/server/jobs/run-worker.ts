import "server-only";
import { getDb } from "@/db/client";
import { env } from "@/lib/env";
import type { SimulationPool } from "@/lib/spatial";
import { executeRun } from "../analysis/execute-run";
import { failStale } from "../analysis/run-rows";
import { createQueuedPool, workChunks } from "./chunk-queue";
import { openBoss, RUN_EXPIRE_SECONDS, workRuns } from "./pg-boss-queue";
import { warmSimulationPool } from "./sim-pool";
import { createSimulationPool } from "./thread-pool";

export type RunWorker = { stop: () => Promise<void> };

export interface RunWorkerOptions {
  /** Runs this process coordinates at a time. */
  concurrency?: number;
  /** Worker threads, and so chunk jobs taken at a time (default: the pool's). */
  threads?: number;
  /**
   * "shared" (default): a run's simulations become chunk jobs that every worker process takes (this one
   * included), so workers on several machines share one run; "local": this process simulates its runs alone.
   */
  share?: "shared" | "local";
  /** Chunks each simulation set of a shared run is cut into (default 32). */
  chunks?: number;
  /** Hears "run … taken", "chunk … taken", "chunk … done" (LOAMWORK_WORKER_LOG=1 prints them). */
  log?: (line: string) => void;
}

/**
 * A worker process's loop (`npm run worker`): takes runs from pg-boss, reads their records from the shared
 * PostgreSQL database, has their simulations computed — by every worker process through chunk jobs, or in
 * its own worker-thread pool — and writes status, progress and results back. It also takes other workers'
 * chunks. Runs whose worker vanished long ago are marked failed at start; pg-boss retries a lost job once,
 * a lost chunk three times.
 */
export async function startRunWorker(options: RunWorkerOptions = {}): Promise<RunWorker> {
  const url = env().DATABASE_URL;
  if (!url) throw new Error("The run worker needs DATABASE_URL (a PostgreSQL server shared with the app).");
  const db = await getDb();
  const stale = await failStale(db, new Date(Date.now() - 2 * RUN_EXPIRE_SECONDS * 1000));
  if (stale) console.log(`[loamwork] marked ${stale} abandoned run(s) failed`);
  const pool: SimulationPool = createSimulationPool({ threads: options.threads });
  if (env().NODE_ENV !== "test") void warmSimulationPool(pool);
  const boss = await openBoss(url);
  await workChunks(boss, pool, pool.threads, options.log);
  const execute = async (runId: string, signal: AbortSignal): Promise<void> => {
    if (options.share === "local") return executeRun(db, runId, { signal, pool });
    const shared = createQueuedPool(boss, { chunks: options.chunks });
    try {
      await executeRun(db, runId, { signal, pool: shared });
    } finally {
      await shared.destroy();
    }
  };
  const stopWork = await workRuns(boss, execute, options.concurrency ?? 1, options.log);
  return {
    stop: async () => {
      await stopWork();
      await pool.destroy();
    },
  };
}
