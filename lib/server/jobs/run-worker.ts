import "server-only";
import { getDb } from "@/db/client";
import { env } from "@/lib/env";
import type { SimulationPool } from "@/lib/spatial";
import { executeRun } from "../analysis/execute-run";
import { failStale } from "../analysis/run-rows";
import { RUN_EXPIRE_SECONDS, workRuns } from "./pg-boss-queue";
import { warmSimulationPool } from "./sim-pool";
import { createSimulationPool } from "./thread-pool";

export type RunWorker = { stop: () => Promise<void> };

/**
 * A worker process's loop (`npm run worker`): takes runs from pg-boss, reads their records from the shared
 * PostgreSQL database, simulates in its own worker-thread pool and writes status, progress and results
 * back. Runs whose worker vanished long ago are marked failed at start; pg-boss retries a lost job once.
 */
export async function startRunWorker(options: { concurrency?: number; threads?: number } = {}): Promise<RunWorker> {
  const url = env().DATABASE_URL;
  if (!url) throw new Error("The run worker needs DATABASE_URL (a PostgreSQL server shared with the app).");
  const db = await getDb();
  const stale = await failStale(db, new Date(Date.now() - 2 * RUN_EXPIRE_SECONDS * 1000));
  if (stale) console.log(`[loamwork] marked ${stale} abandoned run(s) failed`);
  const pool: SimulationPool = createSimulationPool({ threads: options.threads });
  if (env().NODE_ENV !== "test") void warmSimulationPool(pool);
  const stopWork = await workRuns(url, (runId, signal) => executeRun(db, runId, { signal, pool }), options.concurrency ?? 1);
  return {
    stop: async () => {
      await stopWork();
      await pool.destroy();
    },
  };
}
