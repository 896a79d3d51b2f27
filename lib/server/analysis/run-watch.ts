import "server-only";
import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { analysisRuns } from "@/db/schema";
import { freshestProgress, isFinished, watchRun, type RunStatus } from "../jobs/run-events";
import { runQueueKind } from "../jobs/runner";
import { readRun } from "./runs";

/** How often the row is looked at besides the events: a run in another process is seen only this way. */
const ROW_CHECK_MS = { local: 1000, remote: 200 };
const KEEP_ALIVE_MS = 15_000;
const PROGRESS_EVERY_MS = 100;

/** The small part of a run that changes while it executes, as a watcher receives it. */
export type RunProgressEvent = { status: RunStatus; progress: number; startedAt: string | null; now: string };

/**
 * A run as a stream of server-sent events (text/event-stream), for a page watching it: first `run` with
 * the whole run as GET …/runs/{runId} returns it, then `progress` at each step of the simulations, and at
 * the end `run` once more with the status it finished with and its result, after which the stream closes.
 * A run executing in this process is followed through its events; the row is checked as well, which is
 * how a run taken by a separate worker process (pg-boss) is followed.
 */
export async function runEventStream(db: Db, siteId: string, runId: string, signal: AbortSignal): Promise<Response> {
  const first = await readRun(db, siteId, runId); // a run that does not exist (or is another site's) is a 404 here
  const encoder = new TextEncoder();
  let stop = () => {};
  const stream = new ReadableStream<Uint8Array>({
    start(controller) {
      let closed = false;
      let finishing = false;
      let lastProgress = first.progress;
      let lastStatus = first.status;
      let unwatch = () => {};
      let rowCheck: ReturnType<typeof setInterval> | undefined;
      let keepAlive: ReturnType<typeof setInterval> | undefined;
      let later: ReturnType<typeof setTimeout> | undefined;
      const close = () => {
        if (closed) return;
        closed = true;
        unwatch();
        clearInterval(rowCheck);
        clearInterval(keepAlive);
        clearTimeout(later);
        signal.removeEventListener("abort", close);
        try {
          controller.close();
        } catch {
          // already closed from the other side (the watcher cancelled the stream)
        }
      };
      stop = close;
      const write = (text: string) => {
        if (closed) return;
        try {
          controller.enqueue(encoder.encode(text));
        } catch {
          close(); // the watcher went away
        }
      };
      const send = (event: string, data: unknown) => write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
      // At most one progress event per PROGRESS_EVERY_MS (the latest wins): the engine reports every chunk
      // of simulations, far more often than a progress bar needs redrawing.
      let lastSentAt = 0;
      let pending: { status: RunStatus; value: number; startedAt: string | null } | null = null;
      const flush = () => {
        clearTimeout(later);
        later = undefined;
        if (!pending) return;
        const { status, value, startedAt } = pending;
        pending = null;
        lastSentAt = Date.now();
        send("progress", { status, progress: value, startedAt, now: new Date().toISOString() } satisfies RunProgressEvent);
      };
      const progress = (status: RunStatus, value: number, startedAt: string | null) => {
        if (status === lastStatus && value <= lastProgress) return;
        lastStatus = status;
        lastProgress = value;
        pending = { status, value, startedAt };
        const wait = lastSentAt + PROGRESS_EVERY_MS - Date.now();
        if (wait <= 0) flush();
        else later ??= setTimeout(flush, wait);
      };
      const finish = () => {
        if (finishing || closed) return;
        finishing = true;
        readRun(db, siteId, runId).then(
          (view) => {
            send("run", view);
            close();
          },
          () => close(),
        );
      };
      const checkRow = () => {
        db.select({ status: analysisRuns.status, progress: analysisRuns.progress, startedAt: analysisRuns.startedAt })
          .from(analysisRuns)
          .where(eq(analysisRuns.id, runId))
          .then(([row]) => {
            if (!row || isFinished(row.status)) return finish();
            progress(row.status, freshestProgress(runId, row.progress), row.startedAt?.toISOString() ?? null);
          })
          .catch(() => undefined);
      };
      send("run", first);
      if (isFinished(first.status) || signal.aborted) return close();
      unwatch = watchRun(runId, (e) => (isFinished(e.status) ? finish() : progress(e.status, e.progress, e.startedAt)));
      rowCheck = setInterval(checkRow, runQueueKind() === "local" ? ROW_CHECK_MS.local : ROW_CHECK_MS.remote);
      keepAlive = setInterval(() => write(": still watching\n\n"), KEEP_ALIVE_MS);
      signal.addEventListener("abort", close, { once: true });
      checkRow(); // it may have moved on between the first read and the subscription
    },
    cancel() {
      stop();
    },
  });
  return new Response(stream, {
    headers: {
      "content-type": "text/event-stream; charset=utf-8",
      // no-transform keeps the server's compression from holding events back until the stream ends
      "cache-control": "no-cache, no-transform",
      "x-accel-buffering": "no",
    },
  });
}
