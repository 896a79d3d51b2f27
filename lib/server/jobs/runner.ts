import "server-only";
import type PgBoss from "pg-boss";
import { getDb } from "@/db/client";
import { env } from "@/lib/env";
import { executeRun } from "../analysis/execute-run";
import type { ScopeData } from "../analysis/scope-data";
import { failStale, requeueOrphans } from "../analysis/run-rows";
import { LocalRunQueue } from "./local-queue";
import { openBoss, RUN_EXPIRE_SECONDS, sendRun } from "./pg-queue";
import { simulationPool, warmSimulationPool } from "./sim-pool";

/**
 * Where runs execute. Embedded database: in this process (the only one allowed to open PGlite), in the
 * engine's worker-thread pool, off the request. PostgreSQL: through pg-boss to separate worker processes.
 * LOAMWORK_RUN_QUEUE forces one or the other. Under NODE_ENV=test the default is the local queue even on
 * PostgreSQL, so the integration suite runs its jobs in-process on both databases; the pg-boss test opts in.
 */
type Runner = { kind: "local"; queue: LocalRunQueue<ScopeData> } | { kind: "pg-boss"; boss: PgBoss };
const holder = ((globalThis as Record<string, unknown>).__loamworkRunner ??= {}) as { ready?: Promise<Runner> };

export function runQueueKind(): "local" | "pg-boss" {
  const e = env();
  return e.LOAMWORK_RUN_QUEUE ?? (e.DATABASE_URL && e.NODE_ENV !== "test" ? "pg-boss" : "local");
}

async function start(): Promise<Runner> {
  const db = await getDb();
  if (runQueueKind() === "pg-boss") {
    const url = env().DATABASE_URL;
    if (!url) throw new Error("LOAMWORK_RUN_QUEUE=pg-boss needs DATABASE_URL.");
    return { kind: "pg-boss", boss: await openBoss(url) };
  }
  const queue = new LocalRunQueue<ScopeData>((runId, signal, scope) => executeRun(db, runId, { signal, pool: simulationPool(), live: true, scope }));
  // Warm the simulation threads now rather than on the first Run (tests start their own runs, cold or not).
  if (env().NODE_ENV !== "test") void warmSimulationPool();
  // A run left 'running' or 'queued' belongs to a process that stopped (a crash or a restart): run it again.
  for (const id of await requeueOrphans(db)) queue.submit(id);
  return { kind: "local", queue };
}

/** Starts the runner once per process (and recovers runs a crash left behind). */
export function ensureRunner(): Promise<Runner> {
  holder.ready ??= start().catch((err) => {
    holder.ready = undefined;
    throw err;
  });
  return holder.ready;
}

/** Queues a stored run; `scope` is what the creating request read, used if the run starts at once here. */
export async function submitRun(runId: string, scope?: ScopeData): Promise<void> {
  const runner = await ensureRunner();
  if (runner.kind === "local") runner.queue.submit(runId, scope);
  else await sendRun(runner.boss, runId);
}

/** The status is already 'cancelled' in the database; stop the work here if this process is doing it. */
export async function cancelRunJob(runId: string): Promise<void> {
  const runner = await ensureRunner();
  if (runner.kind === "local") runner.queue.cancel(runId);
}

/** Resolves when the local queue has nothing left (tests). */
export async function runsIdle(): Promise<void> {
  const runner = await ensureRunner();
  if (runner.kind === "local") await runner.queue.idle();
}

export async function stopRunner(): Promise<void> {
  const ready = holder.ready;
  holder.ready = undefined;
  if (!ready) return;
  const runner = await ready;
  if (runner.kind === "local") runner.queue.cancelAll();
  else await runner.boss.stop({ graceful: false, wait: true });
}

/** For worker processes: fail runs whose worker vanished long ago (pg-boss retries the job itself). */
export async function sweepStaleRuns(): Promise<number> {
  return failStale(await getDb(), new Date(Date.now() - 2 * RUN_EXPIRE_SECONDS * 1000));
}
