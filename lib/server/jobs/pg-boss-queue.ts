import "server-only";
import PgBoss from "pg-boss";
import { CHUNK_JOB, chunkExpireSeconds, createChunkQueue } from "./chunk-queue";
import type { RunQueue } from "./run-queue";

/**
 * The pg-boss adapter (a PostgreSQL-backed job queue), for Loamwork on a PostgreSQL server: the app only
 * sends the run id; separate worker processes (`npm run worker`, on this or other machines) take the jobs.
 * Cancelling needs no queue call: the run's status in analysis_runs is the truth, and a worker checks it
 * each time it writes progress.
 */
const JOB_NAME = "loamwork-analysis-run";
/** A run longer than this is presumed lost with its worker; pg-boss then retries it once. */
export const RUN_EXPIRE_SECONDS = 15 * 60;

/**
 * pg-boss looks for jobs whose time ran out (a worker gone mid-chunk) at its maintenance; half a chunk's
 * time, so that a lost chunk is offered again within 1.5 times its allowance.
 */
export async function openBoss(connectionString: string): Promise<PgBoss> {
  const maintenanceIntervalSeconds = Math.max(1, Math.min(60, Math.floor(chunkExpireSeconds() / 2)));
  const boss = new PgBoss({ connectionString, max: 4, application_name: "loamwork-runs", maintenanceIntervalSeconds });
  boss.on("error", (err) => console.error("[loamwork] job queue error", err));
  await boss.start();
  await racing(() =>
    boss.createQueue(JOB_NAME, { name: JOB_NAME, retryLimit: 1, expireInSeconds: RUN_EXPIRE_SECONDS }),
  );
  await racing(() => createChunkQueue(boss));
  return boss;
}

/**
 * Workers started together each create the queues; pg-boss's creation of one queue by two processes at
 * once can end in a deadlock or a duplicate for one of them. Trying again finds the queue made.
 */
async function racing(create: () => Promise<void>): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await create();
    } catch (err) {
      const code = (err as { code?: string }).code;
      if (attempt >= 5 || (code !== "40P01" && code !== "23505")) throw err;
      await new Promise((r) => setTimeout(r, 50 + Math.random() * 200 * attempt));
    }
  }
}

/** The app's side: sends runs to the workers. */
export async function startPgBossQueue(connectionString: string): Promise<RunQueue> {
  const boss = await openBoss(connectionString);
  return {
    kind: "pg-boss",
    async submit(runId) {
      const jobId = await boss.send(
        JOB_NAME,
        { runId },
        { retryLimit: 1, expireInSeconds: RUN_EXPIRE_SECONDS, singletonKey: runId },
      );
      if (!jobId) throw new Error(`The job queue did not accept run ${runId}.`);
    },
    async cancel() {
      // The worker executing it sees the cancelled status at its next progress write and stops.
    },
    async idle() {
      // Nothing executes in this process.
    },
    close: () => boss.stop({ graceful: false, wait: true }),
  };
}

export type RunExecutor = (runId: string, signal: AbortSignal) => Promise<void>;

/**
 * A worker process's side: takes runs, `concurrency` at a time, on `boss` (opened by openBoss); returns
 * the function that stops taking them and stops the queue.
 */
export async function workRuns(
  boss: PgBoss,
  execute: RunExecutor,
  concurrency = 1,
  log?: (line: string) => void,
): Promise<() => Promise<void>> {
  const controllers = new Set<AbortController>();
  const ids: string[] = [];
  for (let k = 0; k < concurrency; k++) {
    ids.push(
      await boss.work<{ runId: string }>(JOB_NAME, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async (jobs) => {
        // One job per batch (batchSize 1); an empty batch is nothing to do.
        for (const job of jobs) {
          const controller = new AbortController();
          controllers.add(controller);
          log?.(`run ${job.data.runId} taken`);
          try {
            await execute(job.data.runId, controller.signal);
          } finally {
            controllers.delete(controller);
          }
        }
      }),
    );
  }
  return async () => {
    for (const id of ids) await boss.offWork({ id });
    await boss.offWork(CHUNK_JOB).catch(() => undefined);
    for (const c of controllers) c.abort();
    await boss.stop({ graceful: false, wait: true });
  };
}
