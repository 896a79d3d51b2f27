import "server-only";
import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { analysisRuns } from "@/db/schema";
import { isFinished, watchRun, type RunEvent, type RunStatus } from "../jobs/run-events";
import { readRun } from "./runs";

const KEEP_ALIVE_MS = 15_000;

/** The small part of a run that changes while it executes, as a watcher receives it. */
export type RunProgressEvent = { status: RunStatus; progress: number; startedAt: string | null; now: string };

/**
 * A run as a stream of server-sent events (text/event-stream), for a page watching it: first `run` with
 * the whole run as GET …/runs/{runId} returns it, then `progress` at each step of the simulations, and at
 * the end `run` once more with the status it finished with and its result, after which the stream closes.
 * The run is followed through its row's change notifications (run-events.ts), whichever process executes
 * it; progress arrives already thinned by the executing process (execute-run.ts).
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
      let keepAlive: ReturnType<typeof setInterval> | undefined;
      const close = () => {
        if (closed) return;
        closed = true;
        unwatch();
        clearInterval(keepAlive);
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
      const progress = (status: RunStatus, value: number, startedAt: string | null) => {
        if (status === lastStatus && value <= lastProgress) return; // a change already sent, seen again on a resync
        lastStatus = status;
        lastProgress = value;
        send("progress", {
          status,
          progress: value,
          startedAt,
          now: new Date().toISOString(),
        } satisfies RunProgressEvent);
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
            progress(row.status, row.progress, row.startedAt?.toISOString() ?? null);
          })
          .catch(() => undefined);
      };
      send("run", first);
      if (isFinished(first.status) || signal.aborted) return close();
      keepAlive = setInterval(() => write(": still watching\n\n"), KEEP_ALIVE_MS);
      signal.addEventListener("abort", close, { once: true });
      const onEvent = (e: RunEvent) => (isFinished(e.status) ? finish() : progress(e.status, e.progress, e.startedAt));
      watchRun(runId, { onEvent, onResync: checkRow }).then(
        (stopWatching) => {
          if (closed) return stopWatching();
          unwatch = stopWatching;
          checkRow(); // it may have moved on between the first read and the subscription
        },
        (err) => {
          console.error(`[loamwork] run ${runId}: its changes cannot be followed`, err);
          close(); // the page reconnects, and reads the run afresh
        },
      );
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
