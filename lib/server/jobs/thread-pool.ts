/**
 * The worker-thread pool (piscina) behind the engine's `SimulationPool` interface: one task is one chunk of
 * simulations, its curves come back by structured clone. It lives with the server's jobs, not in the engine,
 * because it needs Node (worker threads, the core count); the command line and the benchmarks use it too,
 * which is why this module does not import "server-only".
 *
 * Worker threads do not inherit the parent's TypeScript loader, so the default worker file is
 * sim-worker-entry.mjs, which registers tsx in the thread and imports sim-worker.ts. That works under vitest,
 * tsx scripts and plain `node`; a bundled server (Next.js) passes `workerFile` by its path in the source tree.
 */
import { availableParallelism } from "node:os";
import { Piscina } from "piscina";
import { SpatialInputError, type SimulationPool } from "../../spatial";

export interface PoolOptions {
  /** Worker threads (default: min(2, available cores)). */
  threads?: number;
  /** Worker module (URL or path); default sim-worker-entry.mjs beside this file. */
  workerFile?: string | URL;
}

export function defaultThreads(): number {
  return Math.max(1, Math.min(2, availableParallelism()));
}

export function createSimulationPool(options: PoolOptions = {}): SimulationPool {
  const threads = options.threads ?? defaultThreads();
  if (!Number.isInteger(threads) || threads < 1 || threads > 64)
    throw new SpatialInputError(`Worker threads must be 1 to 64; got ${threads}.`);
  const file = options.workerFile ?? new URL("./sim-worker-entry.mjs", import.meta.url);
  const piscina = new Piscina({
    filename: file instanceof URL ? file.href : file,
    minThreads: threads,
    maxThreads: threads,
    idleTimeout: 60_000,
  });
  return {
    threads,
    async runChunk(chunk) {
      const out = (await piscina.run(chunk)) as Float64Array | { inputError: string };
      if (out instanceof Float64Array) return out;
      throw new SpatialInputError(out.inputError);
    },
    // close, not destroy: chunks still in a thread (a cancelled or failed run's last ones) finish first, so
    // no result arrives for a task the pool has already forgotten
    destroy: () => piscina.close(),
  };
}
