/**
 * `npm run worker`: a Loamwork run worker for PostgreSQL deployments. Start one or more beside the app (on
 * this or other machines) with the same DATABASE_URL; each takes distribution-test runs from the queue.
 * LOAMWORK_WORKER_CONCURRENCY runs at a time (default 1), each on the engine's worker-thread pool.
 * `npm run build` compiles it, and the threads' entry, to dist/; `npm run worker` runs that JavaScript.
 */
import { closeDb } from "@/db/client";
import { startRunWorker } from "@/lib/server/jobs/run-worker";

const concurrency = Number(process.env.LOAMWORK_WORKER_CONCURRENCY ?? 1);
const worker = await startRunWorker({ concurrency });
console.log(`Loamwork run worker ready (${concurrency} at a time); waiting for runs.`);
const stop = async () => {
  await worker.stop();
  await closeDb();
  process.exit(0);
};
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
