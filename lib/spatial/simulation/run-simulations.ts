/**
 * Simulations cut into chunks of consecutive simulation indices. Each chunk is one task for a pool of
 * threads (the `SimulationPool` interface; the server's jobs provide one with worker threads) or runs in
 * this thread, yielding to the event loop between chunks; its curves are placed by index, so the result is
 * the same for any number of threads and for no pool at all. The engine itself starts no threads.
 */
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
  /**
   * Chunks to cut nsim simulations into, when the pool knows better than the default (a pool whose chunks
   * travel through a job queue wants fewer, longer ones). The numbers do not depend on it.
   */
  chunksFor?(nsim: number): number;
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
export async function runSimulations(
  setup: SimSetup,
  options: RunSimulationsOptions,
): Promise<CurveSet & { sims: Float64Array }> {
  const { seed, streamBase, nsim, pool, signal, onProgress } = options;
  if (!Number.isInteger(nsim) || nsim < 1 || nsim > 100_000)
    throw new SpatialInputError(`The number of simulations must be 1 to 100000; got ${nsim}.`);
  if (signal?.aborted) throw abortError();
  const threads = pool ? pool.threads : 1;
  const chunkCount = Math.max(1, Math.min(nsim, options.chunks ?? pool?.chunksFor?.(nsim) ?? 24 * threads));
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
