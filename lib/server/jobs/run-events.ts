import "server-only";
import { getDb, listen, type Db } from "@/db/client";
import { runStatusEnum } from "@/db/schema";
import { processSingleton } from "@/lib/process-singleton";

/**
 * What anyone watching a run learns as it happens: its status and progress, as committed to its row.
 * The row is the one source; a trigger (drizzle/0005_run_notify.sql) announces each change on the
 * channel below, whichever process wrote it — this one's in-process queue or a separate worker. This
 * process listens once and hands each run's changes to that run's watchers.
 */
export type RunStatus = (typeof runStatusEnum.enumValues)[number];
export type RunEvent = { runId: string; status: RunStatus; progress: number; startedAt: string | null };
export type RunWatcher = {
  onEvent: (event: RunEvent) => void;
  /** The listening connection was lost and is back: changes meanwhile went unheard; read the row again. */
  onResync: () => void;
};

const CHANNEL = "loamwork_run";

type Hub = { watchers: Map<string, Set<RunWatcher>>; listening?: Promise<unknown>; db?: Db };
const hub = processSingleton<Hub>("run-events", () => ({ watchers: new Map() }));

export const isFinished = (status: RunStatus) => status === "done" || status === "failed" || status === "cancelled";

function deliver(payload: string): void {
  let event: RunEvent;
  try {
    const raw = JSON.parse(payload) as RunEvent;
    // Postgres writes timestamps as "…+00:00"; the API speaks ISO 8601 in UTC as toISOString() gives it.
    event = { ...raw, startedAt: raw.startedAt ? new Date(raw.startedAt).toISOString() : null };
  } catch {
    console.error("[loamwork] a run notification could not be read", payload);
    return;
  }
  for (const w of hub.watchers.get(event.runId) ?? []) w.onEvent(event);
}

function resyncAll(): void {
  for (const set of hub.watchers.values()) for (const w of set) w.onResync();
}

/** Listens once per database handle (a closed and reopened database needs listening afresh). */
async function startListening(): Promise<void> {
  const db = await getDb();
  if (hub.db !== db || !hub.listening) {
    hub.db = db;
    hub.listening = listen(CHANNEL, deliver, resyncAll).catch((err) => {
      hub.listening = undefined;
      throw err;
    });
  }
  await hub.listening;
}

/**
 * Calls the watcher with each change of the run from the moment this resolves; returns the function that
 * stops watching. Changes committed before it resolved are not replayed: read the row after it.
 */
export async function watchRun(runId: string, watcher: RunWatcher): Promise<() => void> {
  await startListening();
  let set = hub.watchers.get(runId);
  if (!set) hub.watchers.set(runId, (set = new Set()));
  set.add(watcher);
  return () => {
    set.delete(watcher);
    if (set.size === 0 && hub.watchers.get(runId) === set) hub.watchers.delete(runId);
  };
}
