/**
 * `npm run worker`: a Loamwork run worker for PostgreSQL deployments. Start one or more beside the app (on
 * this or other machines) with the same DATABASE_URL; each takes distribution-test runs from the queue.
 * LOAMWORK_WORKER_CONCURRENCY runs at a time (default 1). A run's simulations are cut into chunk jobs that
 * every worker takes, this one included (LOAMWORK_WORKER_SHARE=local keeps a run's simulations in the
 * process that took it); LOAMWORK_WORKER_THREADS worker threads simulate here (default 2).
 * LOAMWORK_CHUNK_EXPIRE_SECONDS (default 300): after this long a chunk whose worker went silent is offered
 * to another. LOAMWORK_RUN_CHUNKS (default 32): chunks per simulation set. LOAMWORK_WORKER_LOG=1 prints every run and
 * chunk taken.
 * `npm run build` compiles it, and the threads' entry, to dist/; `npm run worker` runs that JavaScript.
 */
import { closeDb } from "@/db/client";
import { startRunWorker } from "@/lib/server/jobs/run-worker";

const concurrency = Number(process.env.LOAMWORK_WORKER_CONCURRENCY ?? 1);
const threads = process.env.LOAMWORK_WORKER_THREADS ? Number(process.env.LOAMWORK_WORKER_THREADS) : undefined;
const share = process.env.LOAMWORK_WORKER_SHARE === "local" ? "local" : "shared";
const log =
  process.env.LOAMWORK_WORKER_LOG === "1"
    ? (line: string) => console.log(`[worker ${process.pid}] ${line}`)
    : undefined;
const chunks = process.env.LOAMWORK_RUN_CHUNKS ? Number(process.env.LOAMWORK_RUN_CHUNKS) : undefined;
const worker = await startRunWorker({ concurrency, threads, share, chunks, log });
console.log(
  `Loamwork run worker ready (${concurrency} at a time, simulations ${share === "shared" ? "shared with every worker" : "in this process"}); waiting for runs.`,
);
const stop = async () => {
  await worker.stop();
  await closeDb();
  process.exit(0);
};
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
