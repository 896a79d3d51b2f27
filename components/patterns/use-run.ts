"use client";

import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/ui/fetch-json";
import type { RunView } from "@/lib/server/analysis/run-view";

/** A run, polled quickly while it is queued or running, then left alone. */
export function useRun(siteId: string, runId: string | null) {
  return useQuery({
    queryKey: ["run", siteId, runId],
    queryFn: () => fetchJson<RunView>(`/api/sites/${siteId}/runs/${runId}`),
    enabled: !!runId,
    staleTime: 0,
    refetchInterval: (q) => (q.state.data && (q.state.data.status === "queued" || q.state.data.status === "running") ? 150 : false),
  });
}

export function useRuns(siteId: string) {
  return useQuery({
    queryKey: ["runs", siteId],
    queryFn: () => fetchJson<Omit<RunView, "result">[]>(`/api/sites/${siteId}/runs`),
    staleTime: 0,
  });
}
