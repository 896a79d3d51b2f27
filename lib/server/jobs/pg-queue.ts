import "server-only";
import PgBoss from "pg-boss";

/**
 * Runs through pg-boss (a PostgreSQL-backed job queue) when Loamwork uses a PostgreSQL server: the app only
 * sends the run id; separate worker processes (`npm run worker`, on this or other machines) take the jobs.
 * Cancelling needs no queue call: the run's status in analysis_runs is the truth, and a worker checks it
 * each time it writes progress.
 */
export const RUN_QUEUE = "loamwork-analysis-run";
/** A run longer than this is presumed lost with its worker; pg-boss then retries it once. */
export const RUN_EXPIRE_SECONDS = 15 * 60;

export async function openBoss(connectionString: string): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString, max: 4, application_name: "loamwork-runs" });
  boss.on("error", (err) => console.error("[loamwork] job queue error", err));
  await boss.start();
  await boss.createQueue(RUN_QUEUE, { name: RUN_QUEUE, retryLimit: 1, expireInSeconds: RUN_EXPIRE_SECONDS });
  return boss;
}

export async function sendRun(boss: PgBoss, runId: string): Promise<void> {
  const jobId = await boss.send(RUN_QUEUE, { runId }, { retryLimit: 1, expireInSeconds: RUN_EXPIRE_SECONDS, singletonKey: runId });
  if (!jobId) throw new Error(`The job queue did not accept run ${runId}.`);
}

export type RunExecutor = (runId: string, signal: AbortSignal) => Promise<void>;

/** Takes runs from the queue, `concurrency` at a time per process; returns a stop function. */
export async function workRuns(boss: PgBoss, execute: RunExecutor, concurrency = 1): Promise<() => Promise<void>> {
  const controllers = new Set<AbortController>();
  const ids: string[] = [];
  for (let k = 0; k < concurrency; k++) {
    ids.push(
      await boss.work<{ runId: string }>(RUN_QUEUE, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
        const controller = new AbortController();
        controllers.add(controller);
        try {
          await execute(job.data.runId, controller.signal);
        } finally {
          controllers.delete(controller);
        }
      }),
    );
  }
  return async () => {
    for (const id of ids) await boss.offWork({ id });
    for (const c of controllers) c.abort();
  };
}
