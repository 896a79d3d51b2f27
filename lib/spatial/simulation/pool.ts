/**
 * Simulations over a worker-thread pool (piscina). A run is cut into chunks of consecutive simulation
 * indices; each chunk is one task, its curves come back by structured clone and are placed by index, so the
 * result is the same for any number of threads (and for no pool at all: `runSimulations` without a pool
 * runs the same chunks in this thread, yielding to the event loop between them).
 *
 * Worker threads do not inherit the parent's TypeScript loader, so the default worker file is
 * worker-entry.mjs, which registers tsx in the thread and imports worker.ts. That works under vitest, tsx
 * scripts and plain `node`; a bundled server (Next.js) should pass `workerFile` pointing at a copy of this
 * folder outside the bundle, or at a compiled worker.js.
 */
import { availableParallelism } from "node:os";
import { Piscina } from "piscina";
import type { CurveSet } from "../envelopes/envelope";
import { SpatialInputError } from "../errors";
import { runSimChunk } from "./sim-chunk";
import type { SimChunk, SimSetup } from "./sim-models";

export interface SimulationPool {
  readonly threads: number;
  /** One chunk in a thread (never aborted mid-task: see runSimulations). */
  runChunk(chunk: SimChunk): Promise<Float64Array>;
  /** Stop the threads once the chunks they hold are done. */
  destroy(): Promise<void>;
}

export interface PoolOptions {
  /** Worker threads (default: min(2, available cores)). */
  threads?: number;
  /** Worker module (URL or path); default worker-entry.mjs beside this file. */
  workerFile?: string | URL;
}

export function defaultThreads(): number {
  return Math.max(1, Math.min(2, availableParallelism()));
}

export function createSimulationPool(options: PoolOptions = {}): SimulationPool {
  const threads = options.threads ?? defaultThreads();
  if (!Number.isInteger(threads) || threads < 1 || threads > 64) throw new SpatialInputError(`Worker threads must be 1 to 64; got ${threads}.`);
  const file = options.workerFile ?? new URL("./worker-entry.mjs", import.meta.url);
  const piscina = new Piscina({ filename: file instanceof URL ? file.href : file, minThreads: threads, maxThreads: threads, idleTimeout: 60_000 });
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

export interface RunSimulationsOptions {
  seed: number;
  /** First random stream of this run (distinct tests of one run use distinct ranges). */
  streamBase: number;
  nsim: number;
  pool?: SimulationPool | null;
  signal?: AbortSignal;
  /** Called with the fraction of simulations done, ending with 1. */
  onProgress?: (fraction: number) => void;
  /** Number of chunks (default: 24 per thread, at most nsim: small enough that no thread idles long at the end). */
  chunks?: number;
}

let keyCounter = 0;

function abortError(): DOMException {
  return new DOMException("The simulation run was cancelled.", "AbortError");
}

/** Run nsim simulations of `setup`; rows of the result are in simulation order. */
export async function runSimulations(setup: SimSetup, options: RunSimulationsOptions): Promise<CurveSet & { sims: Float64Array }> {
  const { seed, streamBase, nsim, pool, signal, onProgress } = options;
  if (!Number.isInteger(nsim) || nsim < 1 || nsim > 100_000) throw new SpatialInputError(`The number of simulations must be 1 to 100000; got ${nsim}.`);
  if (signal?.aborted) throw abortError();
  const threads = pool ? pool.threads : 1;
  const chunkCount = Math.min(nsim, options.chunks ?? 24 * threads);
  const key = `run-${process.pid}-${++keyCounter}`;
  const bounds = Array.from({ length: chunkCount + 1 }, (_, c) => Math.round((c * nsim) / chunkCount));
  let m = 0;
  let sims = new Float64Array(0);
  let done = 0;
  const place = (from: number, to: number, curves: Float64Array): void => {
    const rowLength = curves.length / (to - from);
    if (m === 0) {
      m = rowLength;
      sims = new Float64Array(nsim * m);
    }
    sims.set(curves, from * m);
    done += to - from;
    onProgress?.(done / nsim);
  };
  const chunkAt = (c: number): SimChunk => ({ setup, key, seed, streamBase, from: bounds[c], to: bounds[c + 1] });
  if (!pool) {
    for (let c = 0; c < chunkCount; c++) {
      await new Promise<void>((resolve) => setImmediate(resolve));
      if (signal?.aborted) throw abortError();
      const result = runSimChunk(chunkAt(c), () => signal?.aborted === true);
      place(result.from, result.to, result.curves);
    }
    return { m, s: nsim, sims };
  }
  // A cancelled run stops handing out chunks and returns at once; a chunk already in a thread finishes there
  // (a few tens of milliseconds) and its result is dropped. The pool's threads are never aborted
  // mid-task: piscina terminates a thread to abort a running task, and a result already on its way then
  // arrives for a task it no longer knows (an uncaught "Unexpected message from Worker"); a new thread
  // would also have to load the engine again.
  let next = 0;
  let cancelled = false;
  const lane = async (): Promise<void> => {
    while (!cancelled && next < chunkCount) {
      const chunk = chunkAt(next++);
      const curves = await pool.runChunk(chunk);
      if (cancelled || signal?.aborted) return;
      place(chunk.from, chunk.to, curves);
    }
  };
  let onAbort: (() => void) | undefined;
  const aborted = new Promise<never>((_, reject) => {
    onAbort = () => reject(abortError());
    signal?.addEventListener("abort", onAbort, { once: true });
  });
  try {
    // two chunks in flight per thread, so that no thread waits for its next task
    await Promise.race([Promise.all(Array.from({ length: Math.min(chunkCount, 2 * threads) }, lane)), aborted]);
    if (signal?.aborted) throw abortError();
  } finally {
    cancelled = true;
    if (onAbort) signal?.removeEventListener("abort", onAbort);
    aborted.catch(() => undefined);
  }
  return { m, s: nsim, sims };
}
