"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { fetchJson } from "@/components/ui/fetch-json";
import type { RunProgressEvent } from "@/lib/server/analysis/run-watch";
import type { RunView } from "@/lib/server/analysis/run-view";

type Status = RunView["status"];
/** A run still queued or simulating. */
export const inProgress = (s: Status | undefined) => s === "queued" || s === "running";
/** Poll interval when the event stream cannot be had (a proxy that refuses it, an old browser). */
const FALLBACK_POLL_MS = 150;

/**
 * A run. While it is queued or running the page follows its event stream (…/runs/{id}/events): progress
 * arrives as the server makes it and the finished run the moment it is stored, with no polling. If the
 * stream fails, the run is polled instead.
 */
export function useRun(siteId: string, runId: string | null) {
  const qc = useQueryClient();
  const [streamFailedFor, setStreamFailedFor] = useState<string | null>(null);
  const polling = streamFailedFor !== null && streamFailedFor === runId;
  const query = useQuery({
    queryKey: ["run", siteId, runId],
    queryFn: () => fetchJson<RunView>(`/api/sites/${siteId}/runs/${runId}`),
    enabled: !!runId,
    // The stream keeps a run in progress fresh; a finished run is read again when next opened (out of date?).
    staleTime: (q) => (!polling && inProgress(q.state.data?.status) ? Infinity : 0),
    refetchInterval: (q) => (polling && inProgress(q.state.data?.status) ? FALLBACK_POLL_MS : false),
  });
  const following = !!runId && !polling && inProgress(query.data?.status);
  useEffect(() => {
    if (!following || !runId) return;
    if (typeof EventSource === "undefined") {
      setStreamFailedFor(runId);
      return;
    }
    const key = ["run", siteId, runId];
    const source = new EventSource(`/api/sites/${siteId}/runs/${runId}/events`);
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
    source.onerror = () => {
      if (ended) return;
      source.close();
      setStreamFailedFor(runId);
    };
    return () => source.close();
  }, [following, siteId, runId, qc]);
  return query;
}

export function useRuns(siteId: string) {
  return useQuery({
    queryKey: ["runs", siteId],
    queryFn: () => fetchJson<Omit<RunView, "result">[]>(`/api/sites/${siteId}/runs`),
    staleTime: 0,
  });
}
