import "server-only";
import { randomUUID } from "node:crypto";
import type PgBoss from "pg-boss";
import { env } from "@/lib/env";
import { SpatialInputError, type SimChunk, type SimulationPool } from "@/lib/spatial";

/**
 * One run's simulations shared by every `npm run worker` process on a PostgreSQL deployment. The worker
 * that took the run (the coordinator) hands the engine a pool whose chunks are pg-boss jobs; each worker
 * process, the coordinator included, takes chunk jobs and simulates them on its own worker threads. Every
 * simulation draws from the random stream of (seed, stream base + index), and a chunk's curves are placed
 * by index, so the numbers are those of one process with the same seed, however the chunks were shared.
 * A worker that dies mid-chunk leaves its job active; once the job's time runs out pg-boss offers it again
 * and another worker computes it.
 */
export const CHUNK_JOB = "loamwork-simulation-chunk";

/** How long a chunk may take before pg-boss presumes its worker lost and offers it again. */
export function chunkExpireSeconds(): number {
  return env().LOAMWORK_CHUNK_EXPIRE_SECONDS;
}
const CHUNK_RETRIES = 3;

/** Curves travel as their bytes, base64: exact, including the NaN of a border curve beyond its range. */
export function encodeCurves(curves: Float64Array): string {
  return Buffer.from(curves.buffer, curves.byteOffset, curves.byteLength).toString("base64");
}

export function decodeCurves(text: string): Float64Array {
  const bytes = Buffer.from(text, "base64");
  const out = new Float64Array(bytes.length / 8);
  new Uint8Array(out.buffer).set(bytes);
  return out;
}

type ChunkOutput = { curves: string } | { inputError: string };

export async function createChunkQueue(boss: PgBoss): Promise<void> {
  await boss.createQueue(CHUNK_JOB, {
    name: CHUNK_JOB,
    retryLimit: CHUNK_RETRIES,
    retryDelay: 0,
    expireInSeconds: chunkExpireSeconds(),
  });
}

export interface QueuedPoolOptions {
  /**
   * Chunks a run's simulations are cut into (default 32): several per worker thread, each long enough to outweigh a
   * job's round trip.
   */
  chunks?: number;
  /** How often the coordinator looks for finished chunks (ms). */
  pollMs?: number;
}

/**
 * The coordinator's side: a SimulationPool whose every chunk is a job any worker may take. All chunks of a
 * simulation set are queued at once (the workers pace themselves); `destroy` withdraws the ones not yet
 * taken, after the run ends or is cancelled.
 */
export function createQueuedPool(boss: PgBoss, options: QueuedPoolOptions = {}): SimulationPool {
  const chunks = options.chunks ?? 32;
  const pollMs = options.pollMs ?? 200;
  const prefix = randomUUID();
  const waiting = new Map<string, { resolve: (c: Float64Array) => void; reject: (e: Error) => void }>();
  let timer: NodeJS.Timeout | null = null;
  let destroyed = false;

  // one query for every chunk still awaited, rather than one per chunk
  const poll = async (): Promise<void> => {
    timer = null;
    if (destroyed || waiting.size === 0) return;
    try {
      const { rows } = await boss
        .getDb()
        .executeSql("select id::text as id, state, output from pgboss.job where name = $1 and id = any($2::uuid[])", [
          CHUNK_JOB,
          [...waiting.keys()],
        ]);
      for (const row of rows as { id: string; state: string; output: ChunkOutput | null }[]) {
        const w = waiting.get(row.id);
        if (!w) continue;
        if (row.state === "completed" && row.output) {
          waiting.delete(row.id);
          if ("inputError" in row.output) w.reject(new SpatialInputError(row.output.inputError));
          else w.resolve(decodeCurves(row.output.curves));
        } else if (row.state === "failed" || row.state === "cancelled") {
          waiting.delete(row.id);
          w.reject(
            new Error(
              `A chunk of simulations ${row.state === "failed" ? `failed in every worker that took it (${CHUNK_RETRIES + 1} tries)` : "was withdrawn"}.`,
            ),
          );
        }
      }
    } catch (err) {
      for (const w of waiting.values()) w.reject(err as Error);
      waiting.clear();
    }
    if (!destroyed && waiting.size > 0) timer ??= setTimeout(poll, pollMs);
  };

  return {
    threads: chunks,
    chunksFor: (nsim) => Math.min(nsim, chunks),
    async runChunk(chunk) {
      if (destroyed) throw new DOMException("The simulation run was cancelled.", "AbortError");
      // a key unique across processes and machines: workers keep prepared tables per key
      const data: SimChunk = { ...chunk, key: `${prefix}:${chunk.key}` };
      const id = await boss.send(CHUNK_JOB, data, {
        retryLimit: CHUNK_RETRIES,
        retryDelay: 0,
        expireInSeconds: chunkExpireSeconds(),
      });
      if (!id) throw new Error("The job queue did not accept a chunk of simulations.");
      const result = new Promise<Float64Array>((resolve, reject) => waiting.set(id, { resolve, reject }));
      timer ??= setTimeout(poll, pollMs);
      return result;
    },
    async destroy() {
      destroyed = true;
      if (timer) clearTimeout(timer);
      const left = [...waiting.keys()];
      for (const w of waiting.values()) w.reject(new DOMException("The simulation run was cancelled.", "AbortError"));
      waiting.clear();
      if (left.length) await boss.cancel(CHUNK_JOB, left).catch(() => undefined);
    },
  };
}

/**
 * A worker process's side: `count` loops (one per worker thread) each taking one chunk job at a time and
 * simulating it on `pool`. `log` hears of every chunk taken and finished (the workers' test follows them).
 */
export async function workChunks(
  boss: PgBoss,
  pool: SimulationPool,
  count: number,
  log?: (line: string) => void,
): Promise<string[]> {
  const ids: string[] = [];
  for (let k = 0; k < count; k++) {
    ids.push(
      await boss.work<SimChunk>(
        CHUNK_JOB,
        { batchSize: 1, pollingIntervalSeconds: 0.5 },
        async ([job]): Promise<ChunkOutput> => {
          // batchSize 1: pg-boss calls with exactly one job
          if (!job) throw new Error("The queue called the chunk worker with no chunk.");
          log?.(`chunk ${job.id} taken`);
          try {
            const curves = await pool.runChunk(job.data);
            log?.(`chunk ${job.id} done`);
            return { curves: encodeCurves(curves) };
          } catch (err) {
            if (err instanceof SpatialInputError) return { inputError: err.message };
            throw err;
          }
        },
      ),
    );
  }
  return ids;
}
