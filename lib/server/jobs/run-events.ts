import "server-only";
import { EventEmitter } from "node:events";
import { runStatusEnum } from "@/db/schema";

/**
 * What a run executing in this process tells anyone watching it, as it happens: its status and progress
 * on the server's clock. The run's row stays the truth (a reload reads it); these events let an open
 * Patterns page follow a local run without asking the database every few hundred milliseconds. Runs that
 * separate worker processes take (pg-boss) publish nothing here; their watchers read the row instead.
 */
export type RunStatus = (typeof runStatusEnum.enumValues)[number];
export type RunEvent = { runId: string; status: RunStatus; progress: number; startedAt: string | null };

type Bus = { emitter: EventEmitter; latest: Map<string, RunEvent> };
const bus = ((globalThis as Record<string, unknown>).__loamworkRunEvents ??= (() => {
  const emitter = new EventEmitter();
  emitter.setMaxListeners(0); // one listener per open page watching a run
  return { emitter, latest: new Map<string, RunEvent>() };
})()) as Bus;

export const isFinished = (status: RunStatus) => status === "done" || status === "failed" || status === "cancelled";

export function publishRun(event: RunEvent): void {
  // Only a run still in progress needs remembering, for a watcher that arrives between two events.
  if (isFinished(event.status)) bus.latest.delete(event.runId);
  else bus.latest.set(event.runId, event);
  bus.emitter.emit(event.runId, event);
}

/**
 * Forget a run's last event once it has stopped in this process, however it stopped (a cancel or an
 * aborted write publishes no end event; watchers learn those from the row).
 */
export function forgetRun(runId: string): void {
  bus.latest.delete(runId);
}

/** A running run's progress: the row's, or the fresher one this process last published for it. */
export function freshestProgress(runId: string, rowProgress: number): number {
  const live = bus.latest.get(runId);
  return live && live.status === "running" && live.progress > rowProgress ? live.progress : rowProgress;
}

/** Calls `listener` with each event of the run from now on; returns the unsubscribe function. */
export function watchRun(runId: string, listener: (event: RunEvent) => void): () => void {
  bus.emitter.on(runId, listener);
  return () => bus.emitter.off(runId, listener);
}
