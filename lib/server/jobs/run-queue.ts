import "server-only";
import { getDb } from "@/db/client";
import { env } from "@/lib/env";
import { processSingleton } from "@/lib/process-singleton";
import type { ScopeData } from "../analysis/scope-data";
import { startInProcessQueue } from "./in-process-queue";
import { startPgBossQueue } from "./pg-boss-queue";

/**
 * Where stored runs go to be executed. Two adapters behind one interface:
 * - in-process (the embedded database, which only this process may open): runs execute here, off the
 *   request, on the engine's worker-thread pool;
 * - pg-boss (a PostgreSQL server): this process only sends the run id; `npm run worker` processes take it.
 * Either way a run's progress reaches its watchers the same way: through its row (run-events.ts).
 * LOAMWORK_RUN_QUEUE forces one or the other. Under NODE_ENV=test the default is in-process even on
 * PostgreSQL, so the integration suite runs its jobs in-process on both databases; the pg-boss test opts in.
 */
export interface RunQueue {
  readonly kind: RunQueueKind;
  /** Queues a stored run; `scope` is what the creating request read, used only if the run starts at once here. */
  submit(runId: string, scope?: ScopeData): Promise<void>;
  /** The run's row already says cancelled; stops its work if this process is doing it. */
  cancel(runId: string): Promise<void>;
  /** Resolves when nothing this process executes is queued or running (tests, shutdown). */
  idle(): Promise<void>;
  close(): Promise<void>;
}
export type RunQueueKind = "local" | "pg-boss";

const holder = processSingleton<{ ready?: Promise<RunQueue> }>("run-queue", () => ({}));

export function runQueueKind(): RunQueueKind {
  const e = env();
  return e.LOAMWORK_RUN_QUEUE ?? (e.DATABASE_URL && e.NODE_ENV !== "test" ? "pg-boss" : "local");
}

async function start(): Promise<RunQueue> {
  if (runQueueKind() === "local") return startInProcessQueue(await getDb());
  const url = env().DATABASE_URL;
  if (!url) throw new Error("LOAMWORK_RUN_QUEUE=pg-boss needs DATABASE_URL.");
  return startPgBossQueue(url);
}

/**
 * This process's run queue, started on first use — the one place it starts. The server asks for it at
 * boot (instrumentation.ts), so runs a stopped process left behind start again without waiting for a
 * new one; anything else that submits or cancels gets the same queue.
 */
export function runQueue(): Promise<RunQueue> {
  holder.ready ??= start().catch((err) => {
    holder.ready = undefined;
    throw err;
  });
  return holder.ready;
}

/** Resolves when the queue has nothing left to execute here (tests). */
export async function runsIdle(): Promise<void> {
  await (await runQueue()).idle();
}

export async function stopRunQueue(): Promise<void> {
  const ready = holder.ready;
  holder.ready = undefined;
  if (ready) await (await ready).close();
}
