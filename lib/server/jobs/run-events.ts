import "server-only";
import { EventEmitter } from "node:events";

/**
 * What a run executing in this process tells anyone watching it, as it happens: its status and progress
 * on the server's clock. The run's row stays the truth (a reload reads it); these events let an open
 * Patterns page follow a local run without asking the database every few hundred milliseconds. Runs that
 * separate worker processes take (pg-boss) publish nothing here; their watchers read the row instead.
 */
export type RunStatus = "queued" | "running" | "done" | "failed" | "cancelled";
export type RunEvent = { runId: string; status: RunStatus; progress: number; startedAt: string | null; at: string };

type Bus = { emitter: EventEmitter; latest: Map<string, RunEvent> };
const bus = ((globalThis as Record<string, unknown>).__loamworkRunEvents ??= (() => {
  const emitter = new EventEmitter();
  emitter.setMaxListeners(0); // one listener per open page watching a run
  return { emitter, latest: new Map<string, RunEvent>() };
})()) as Bus;

export const isFinished = (status: RunStatus) => status === "done" || status === "failed" || status === "cancelled";

export function publishRun(event: Omit<RunEvent, "at">): void {
  const full = { ...event, at: new Date().toISOString() };
  // Only a run still in progress needs remembering, for a watcher that arrives between two events.
  if (isFinished(full.status)) bus.latest.delete(full.runId);
  else bus.latest.set(full.runId, full);
  bus.emitter.emit(full.runId, full);
}

/** The last event of a run in progress in this process, if any. */
export function latestRunEvent(runId: string): RunEvent | undefined {
  return bus.latest.get(runId);
}

/** Calls `listener` with each event of the run from now on; returns the unsubscribe function. */
export function watchRun(runId: string, listener: (event: RunEvent) => void): () => void {
  bus.emitter.on(runId, listener);
  return () => bus.emitter.off(runId, listener);
}
