"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useEffect, type ReactNode } from "react";
import { apiClient } from "@/lib/api/client";
import type { RunView } from "@/lib/api/patterns-responses";
import { RunProgress } from "./run-progress";
import { RunResultView } from "./run-result";
import { inProgress, useRun } from "./use-run";

type Props = {
  siteId: string;
  runId: string;
  canRun: boolean;
  onUseSettings: (run: RunView) => void;
  fallback: ReactNode;
};

/**
 * The run named in the address: progress with cancel while it goes on, then its verdicts and figures.
 * It follows the run on its own, so the progress of a run re-draws this panel only, not the form and the
 * saved-runs list beside it.
 */
export function RunPanel({ siteId, runId, canRun, onUseSettings, fallback }: Props) {
  const qc = useQueryClient();
  const run = useRun(siteId, runId);
  const status = run.data?.status;
  useEffect(() => {
    if (!status) return;
    // While a run goes on, its row in the list follows it here; the list is read again once it has ended
    // (out-of-date marks included), not while the server is busy simulating.
    if (inProgress(status)) {
      qc.setQueryData(["runs", siteId], (old: Omit<RunView, "result">[] | undefined) =>
        old?.map((r) => (r.id === runId && r.status !== status ? { ...r, status } : r)),
      );
    } else void qc.invalidateQueries({ queryKey: ["runs", siteId] });
  }, [status, runId, qc, siteId]);
  const cancel = useMutation({
    mutationFn: (id: string) => apiClient.call("runCancel", { siteId, runId: id }),
    onSuccess: (v) => {
      qc.setQueryData(["run", siteId, v.id], (old: RunView | undefined) => ({
        ...(old ?? v),
        ...v,
        result: old?.result ?? null,
      }));
      void qc.invalidateQueries({ queryKey: ["runs", siteId] });
    },
  });

  if (run.error && !run.data)
    return (
      <p role="alert" className="sheet text-warn">
        {(run.error as Error).message}
      </p>
    );
  const data = run.data;
  if (!data) return <>{fallback}</>;
  return (
    <>
      {inProgress(data.status) && (
        <RunProgress
          run={data}
          canCancel={canRun}
          cancelling={cancel.isPending}
          onCancel={() => cancel.mutate(data.id)}
        />
      )}
      {data.status === "failed" && (
        <p role="alert" className="sheet border-warn text-warn">
          This run failed: {data.error}
        </p>
      )}
      {data.status === "cancelled" && (
        <p role="status" className="sheet">
          This run was cancelled; nothing was saved but its settings.
        </p>
      )}
      {cancel.error && (
        <p className="field-error" role="alert">
          {(cancel.error as Error).message}
        </p>
      )}
      {data.status === "done" && (
        <>
          {canRun && (
            <div className="flex flex-wrap items-center gap-2">
              <button type="button" className="btn" onClick={() => onUseSettings(data)}>
                Put these settings in the form
              </button>
              <span className="text-sm text-ink-soft">
                same scope, tests and seed — run again to check the numbers{data.outOfDate ? " on today's records" : ""}
                .
              </span>
            </div>
          )}
          <RunResultView run={data} />
        </>
      )}
    </>
  );
}
