import "server-only";
import type { Db } from "@/db/client";
import { env } from "@/lib/env";
import { executeRun } from "../analysis/execute-run";
import { requeueOrphans } from "../analysis/run-rows";
import type { ScopeData } from "../analysis/scope-data";
import type { RunQueue } from "./run-queue";
import { simulationPool, warmSimulationPool } from "./sim-pool";

/**
 * The in-process adapter, used with the embedded database: only the app process may open PGlite, so it
 * executes every run itself, on the engine's worker-thread pool. Runs left 'running' or 'queued' by a
 * process that stopped (a crash or a restart) are queued again as it starts.
 */
export async function startInProcessQueue(db: Db): Promise<RunQueue> {
  const runs = new LocalRunQueue<ScopeData>((runId, signal, scope) =>
    executeRun(db, runId, { signal, pool: simulationPool(), scope }),
  );
  // Warm the simulation threads now rather than on the first Run (tests start their own runs, cold or not).
  if (env().NODE_ENV !== "test") void warmSimulationPool();
  for (const id of await requeueOrphans(db)) runs.submit(id);
  return {
    kind: "local",
    submit: async (runId, scope) => runs.submit(runId, scope),
    cancel: async (runId) => runs.cancel(runId),
    idle: () => runs.idle(),
    close: async () => runs.cancelAll(),
  };
}

/**
 * Runs jobs one (or `concurrency`) at a time, each with an AbortController so a cancel stops the
 * simulations in the worker threads at once. Jobs are run ids; the work function is passed in.
 * A submitter may hand over what it already holds for the run (`hint`); it reaches the work function
 * only when the run starts at once, never after waiting behind others, when it would be out of date.
 */
export type RunWork<H> = (runId: string, signal: AbortSignal, hint?: H) => Promise<void>;

export class LocalRunQueue<H = unknown> {
  private readonly waiting: string[] = [];
  private readonly active = new Map<string, AbortController>();
  private readonly hints = new Map<string, H>();
  private idleWaiters: (() => void)[] = [];

  constructor(
    private readonly work: RunWork<H>,
    private readonly concurrency = 1,
  ) {}

  submit(runId: string, hint?: H): void {
    if (this.active.has(runId) || this.waiting.includes(runId)) return;
    this.waiting.push(runId);
    if (hint !== undefined) this.hints.set(runId, hint);
    this.pump();
    this.hints.delete(runId);
  }

  /** Stops a run: drops it from the queue, or aborts it if it is running. */
  cancel(runId: string): void {
    const i = this.waiting.indexOf(runId);
    if (i >= 0) this.waiting.splice(i, 1);
    this.active.get(runId)?.abort();
  }

  cancelAll(): void {
    this.waiting.length = 0;
    for (const c of this.active.values()) c.abort();
  }

  get size(): number {
    return this.waiting.length + this.active.size;
  }

  /** Resolves when nothing is queued or running (tests and shutdown). */
  idle(): Promise<void> {
    if (this.size === 0) return Promise.resolve();
    return new Promise((resolve) => this.idleWaiters.push(resolve));
  }

  private pump(): void {
    while (this.active.size < this.concurrency && this.waiting.length) {
      const runId = this.waiting.shift()!;
      const controller = new AbortController();
      this.active.set(runId, controller);
      // Off the request: the caller of submit() has already answered; failures are recorded on the run by `work`.
      void this.work(runId, controller.signal, this.hints.get(runId))
        .catch((err) => console.error(`[loamwork] run ${runId} failed outside its own error handling`, err))
        .finally(() => {
          this.active.delete(runId);
          this.pump();
          if (this.size === 0) for (const w of this.idleWaiters.splice(0)) w();
        });
    }
  }
}
