"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { apiClient } from "@/lib/api/client";
import type { RunProgressEvent } from "@/lib/server/analysis/run-watch";
import type { RunView } from "@/lib/api/patterns-responses";

type Status = RunView["status"];
/** A run still queued or simulating. */
export const inProgress = (s: Status | undefined) => s === "queued" || s === "running";
/** Wait before reading the run and opening its stream again after the server refused the stream. */
const REOPEN_AFTER_MS = 3000;

/**
 * A run. While it is queued or running the page follows its event stream (…/runs/{id}/events), the one
 * way it learns of progress: it arrives as the server makes it and the finished run the moment it is
 * stored. A dropped stream is reopened by the browser, and each stream starts with the whole run.
 */
export function useRun(siteId: string, runId: string | null) {
  const qc = useQueryClient();
  const [attempt, setAttempt] = useState(0);
  const query = useQuery({
    queryKey: ["run", siteId, runId],
    queryFn: () => apiClient.call("runRead", { siteId, runId: runId ?? "" }),
    enabled: !!runId,
    // The stream keeps a run in progress fresh; a finished run is read again when next opened (out of date?).
    staleTime: (q) => (inProgress(q.state.data?.status) ? Infinity : 0),
  });
  const following = !!runId && inProgress(query.data?.status);
  useEffect(() => {
    if (!following || !runId) return;
    const key = ["run", siteId, runId];
    const source = new EventSource(apiClient.url("runEvents", { siteId, runId }));
    let ended = false;
    source.addEventListener("run", (e) => {
      const view = JSON.parse((e as MessageEvent<string>).data) as RunView;
      qc.setQueryData(key, view);
      if (!inProgress(view.status)) {
        ended = true;
        source.close();
      }
    });
    source.addEventListener("progress", (e) => {
      const p = JSON.parse((e as MessageEvent<string>).data) as RunProgressEvent;
      qc.setQueryData(key, (old: RunView | undefined) => (old && inProgress(old.status) ? { ...old, ...p } : old));
    });
    let reopen: ReturnType<typeof setTimeout> | undefined;
    source.onerror = () => {
      // A dropped connection is retried by the browser itself (readyState CONNECTING); a refusal is final.
      if (ended || source.readyState !== EventSource.CLOSED) return;
      reopen = setTimeout(() => {
        void qc.invalidateQueries({ queryKey: key }); // it may have finished meanwhile: then nothing reopens
        setAttempt((n) => n + 1);
      }, REOPEN_AFTER_MS);
    };
    return () => {
      clearTimeout(reopen);
      source.close();
    };
  }, [following, siteId, runId, qc, attempt]);
  return query;
}

export function useRuns(siteId: string) {
  return useQuery({
    queryKey: ["runs", siteId],
    queryFn: () => apiClient.call("runsList", { siteId }),
    staleTime: 0,
  });
}
