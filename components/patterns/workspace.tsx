"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { usePathname, useSearchParams } from "next/navigation";
import { useEffect, useState } from "react";
import { ApiError, fetchJson } from "@/components/ui/fetch-json";
import type { RunView } from "@/lib/server/analysis/run-view";
import type { ScopeSummary } from "@/lib/server/analysis/scope-summary";
import { CompareView } from "./compare-view";
import { formFromRun, initialForm, toRequest, type FormState } from "./form-state";
import { RunProgress } from "./run-progress";
import { RunResultView } from "./run-result";
import { RunsList } from "./runs-list";
import { ScopePicker } from "./scope-picker";
import { ParamsFields, TestPicker } from "./test-picker";
import type { ClassOption, ContextOption, TrenchOption } from "./types";
import { useRun, useRuns } from "./use-run";

type Props = { siteId: string; canRun: boolean; trenches: TrenchOption[]; contexts: ContextOption[]; classes: ClassOption[] };

/** The Patterns workspace: scope → tests → parameters → run → progress → verdicts, figures, cautions. */
export function PatternsWorkspace({ siteId, canRun, trenches, contexts, classes }: Props) {
  const pathname = usePathname();
  const search = useSearchParams();
  const runId = search.get("run");
  const compare = (search.get("compare") ?? "").split(",").filter(Boolean);
  const qc = useQueryClient();
  const [form, setForm] = useState<FormState>(() => initialForm(trenches.find((t) => contexts.some((c) => c.trenchId === t.id))?.id ?? trenches[0]?.id ?? ""));
  const set = (f: Partial<FormState>) => setForm((old) => ({ ...old, ...f }));

  // The run and the comparison live in the address (reload, share), but nothing on the server depends on
  // them: the history API changes the address and useSearchParams without asking the server for the page.
  const setUrl = (params: { run?: string | null; compare?: string[] }) => {
    const next = new URLSearchParams(search.toString());
    if (params.run !== undefined) (params.run ? next.set("run", params.run) : next.delete("run"));
    if (params.compare !== undefined) (params.compare.length ? next.set("compare", params.compare.join(",")) : next.delete("compare"));
    window.history.replaceState(null, "", `${pathname}?${next.toString()}`);
  };

  const summary = useQuery({
    queryKey: ["scope", siteId, form.trenchId, form.contextIds],
    queryFn: () => fetchJson<ScopeSummary>(`/api/sites/${siteId}/runs/scope?trenchId=${form.trenchId}&contextIds=${form.contextIds.join(",")}&classIds=${classes.map((c) => c.id).join(",")}`),
    enabled: !!form.trenchId && form.contextIds.length > 0 && classes.length > 0,
  });
  const runs = useRuns(siteId);
  const run = useRun(siteId, runId);
  const status = run.data?.status;
  const shownId = run.data?.id;
  useEffect(() => {
    if (!status || !shownId) return;
    // While a run goes on, its row in the list follows it here; the list is read again once it has ended
    // (out-of-date marks included), not while the server is busy simulating.
    if (status === "queued" || status === "running") {
      qc.setQueryData(["runs", siteId], (old: Omit<RunView, "result">[] | undefined) => old?.map((r) => (r.id === shownId ? { ...r, status } : r)));
    } else void qc.invalidateQueries({ queryKey: ["runs", siteId] });
  }, [status, shownId, qc, siteId]);

  const start = useMutation({
    mutationFn: () => fetchJson<RunView>(`/api/sites/${siteId}/runs`, { body: toRequest(form) }),
    onSuccess: (created) => {
      qc.setQueryData(["run", siteId, created.id], created);
      setUrl({ run: created.id });
      const { result: _none, ...listed } = created;
      qc.setQueryData(["runs", siteId], (old: Omit<RunView, "result">[] | undefined) => (old ? [listed, ...old.filter((r) => r.id !== created.id)] : old));
    },
  });
  const cancel = useMutation({
    mutationFn: (id: string) => fetchJson<RunView>(`/api/sites/${siteId}/runs/${id}/cancel`, { method: "POST", body: {} }),
    onSuccess: (v) => {
      qc.setQueryData(["run", siteId, v.id], (old: RunView | undefined) => ({ ...(old ?? v), ...v, result: old?.result ?? null }));
      void qc.invalidateQueries({ queryKey: ["runs", siteId] });
    },
  });
  const startError = start.error instanceof ApiError ? start.error : null;
  const ready = form.contextIds.length > 0 && form.classIds.length > 0;

  return (
    <div className="grid gap-6 xl:grid-cols-[minmax(340px,440px)_1fr]">
      <form
        className="space-y-4"
        aria-label="New distribution-test run"
        onSubmit={(e) => {
          e.preventDefault();
          start.mutate();
        }}
      >
        <ScopePicker form={form} set={set} trenches={trenches} contexts={contexts} classes={classes} summary={summary.data} loading={summary.isFetching} />
        <TestPicker form={form} set={set} summary={summary.data} />
        <ParamsFields form={form} set={set} summary={summary.data} errors={startError?.fieldErrors ?? {}} />
        {startError && <p className="field-error" role="alert">{startError.message}</p>}
        {summary.error && <p className="field-error" role="alert">{(summary.error as Error).message}</p>}
        {canRun ? (
          <button type="submit" className="btn-primary w-full text-lg" disabled={!ready || start.isPending}>
            {start.isPending ? "Starting…" : "Run tests"}
          </button>
        ) : (
          <p className="sheet text-sm">Your role can read every saved run; running tests needs the finds specialist or director role.</p>
        )}
      </form>
      <div className={`min-w-0 space-y-4 ${runId || compare.length === 2 ? "order-first xl:order-none" : ""}`}>
        {compare.length === 2 ? (
          <CompareView siteId={siteId} ids={compare} onClose={() => setUrl({ compare: [] })} />
        ) : runId && run.data ? (
          <>
            {(run.data.status === "queued" || run.data.status === "running") && (
              <RunProgress run={run.data} canCancel={canRun} cancelling={cancel.isPending} onCancel={() => cancel.mutate(run.data!.id)} />
            )}
            {run.data.status === "failed" && <p role="alert" className="sheet border-warn text-warn">This run failed: {run.data.error}</p>}
            {run.data.status === "cancelled" && <p role="status" className="sheet">This run was cancelled; nothing was saved but its settings.</p>}
            {cancel.error && <p className="field-error" role="alert">{(cancel.error as Error).message}</p>}
            {run.data.status === "done" && (
              <>
                {canRun && (
                  <div className="flex flex-wrap items-center gap-2">
                    <button type="button" className="btn" onClick={() => setForm(formFromRun(run.data!))}>Put these settings in the form</button>
                    <span className="text-sm text-ink-soft">same scope, tests and seed — run again to check the numbers{run.data.outOfDate ? " on today's records" : ""}.</span>
                  </div>
                )}
                <RunResultView run={run.data} />
              </>
            )}
          </>
        ) : runId && run.error ? (
          <p role="alert" className="sheet text-warn">{(run.error as Error).message}</p>
        ) : (
          <section className="sheet text-ink-soft">
            <h2 className="text-lg font-bold text-ink">How to read a run here</h2>
            <p className="mt-1">Choose the trench, the contexts that form one surface and the classes; keep the default tests or change them; run. Each class gets a verdict — clustered, evenly spread, or no evidence against the null — from a global Monte Carlo test, with its p-value, the simulations and the seed, so anyone can run it again and get the same numbers.</p>
          </section>
        )}
        <section className="sheet" aria-labelledby="saved-runs">
          <div className="flex items-center justify-between">
            <h2 id="saved-runs" className="text-lg font-bold">Saved runs</h2>
            {compare.length === 1 && <p className="text-sm text-ink-soft">Tick one more finished run to compare.</p>}
          </div>
          {runs.data && (
            <RunsList
              runs={runs.data}
              current={runId}
              compare={compare}
              onOpen={(id) => setUrl({ run: id, compare: [] })}
              onToggleCompare={(id) => setUrl({ compare: compare.includes(id) ? compare.filter((x) => x !== id) : [...compare, id].slice(-2) })}
            />
          )}
        </section>
      </div>
    </div>
  );
}
