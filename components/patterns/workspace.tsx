"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { usePathname, useSearchParams } from "next/navigation";
import { useState } from "react";
import { ApiError, apiClient } from "@/lib/api/client";
import type { RunView } from "@/lib/api/patterns-responses";
import { CompareView } from "./compare-view";
import {
  describeChoices,
  differsFromDefaults,
  formFromRun,
  initialForm,
  toRequest,
  type FormState,
} from "./form-state";
import { RunPanel } from "./run-panel";
import { RunsList } from "./runs-list";
import { ScopePicker } from "./scope-picker";
import { ParamsFields, TestPicker } from "./test-picker";
import type { ClassOption, ContextOption, SpitOption, TrenchOption } from "./types";
import { useRuns } from "./use-run";

type Props = {
  siteId: string;
  canRun: boolean;
  trenches: TrenchOption[];
  contexts: ContextOption[];
  classes: ClassOption[];
  spits: SpitOption[];
};

/** The Patterns workspace: scope → tests → parameters → run → progress → verdicts, figures, cautions. */
export function PatternsWorkspace({ siteId, canRun, trenches, contexts, classes, spits }: Props) {
  const pathname = usePathname();
  const search = useSearchParams();
  const runId = search.get("run");
  const compare = (search.get("compare") ?? "").split(",").filter(Boolean);
  const qc = useQueryClient();
  const [form, setForm] = useState<FormState>(() =>
    initialForm(trenches.find((t) => contexts.some((c) => c.trenchId === t.id))?.id ?? trenches[0]?.id ?? ""),
  );
  const set = (f: Partial<FormState>) => setForm((old) => ({ ...old, ...f }));
  // Tests and settings fold away: the defaults run with one action once the scope is chosen.
  const [unfolded, setUnfolded] = useState(false);

  // The run and the comparison live in the address (reload, share), but nothing on the server depends on
  // them: the history API changes the address and useSearchParams without asking the server for the page.
  const setUrl = (params: { run?: string | null; compare?: string[] }) => {
    const next = new URLSearchParams(search.toString());
    if (params.run !== undefined) params.run ? next.set("run", params.run) : next.delete("run");
    if (params.compare !== undefined)
      params.compare.length ? next.set("compare", params.compare.join(",")) : next.delete("compare");
    window.history.replaceState(null, "", `${pathname}?${next.toString()}`);
  };

  const summary = useQuery({
    queryKey: ["scope", siteId, form.trenchId, form.contextIds, form.levelFrom, form.levelTo, form.spitIds],
    queryFn: () =>
      apiClient.call(
        "runScope",
        { siteId },
        {
          trenchId: form.trenchId,
          contextIds: form.contextIds.join(","),
          classIds: classes.map((c) => c.id).join(","),
          levelFrom: form.levelFrom.trim(),
          levelTo: form.levelTo.trim(),
          spitIds: form.spitIds.join(","),
        },
      ),
    retry: false,
    enabled: !!form.trenchId && form.contextIds.length > 0 && classes.length > 0,
  });
  const runs = useRuns(siteId);
  const start = useMutation({
    mutationFn: () => apiClient.call("runsCreate", { siteId }, toRequest(form)),
    // A refusal that names a setting opens the settings, so the message stands beside its field.
    onError: (e) => {
      if (
        e instanceof ApiError &&
        Object.keys(e.fieldErrors ?? {}).some((k) => k.startsWith("params") || k.startsWith("tests"))
      )
        setUnfolded(true);
    },
    onSuccess: (created) => {
      qc.setQueryData(["run", siteId, created.id], created);
      setUrl({ run: created.id });
      const { result: _none, ...listed } = created;
      qc.setQueryData(["runs", siteId], (old: Omit<RunView, "result">[] | undefined) =>
        old ? [listed, ...old.filter((r) => r.id !== created.id)] : old,
      );
    },
  });
  const startError = start.error instanceof ApiError ? start.error : null;
  const summaryError = summary.error instanceof ApiError ? summary.error : null;
  const help = (
    <section className="sheet text-ink-soft">
      <h2 className="text-lg font-bold text-ink">How to read a run here</h2>
      <p className="mt-1">
        Choose the trench, the contexts that form one surface and the classes, then run: the default tests run as they
        are, and “Tests and settings” unfolds to change them. A run opens with one plain sentence per class and pair —
        grouped together, evenly spread, no clear pattern, or too few to tell — and then each test in its own terms,
        with its p-value, the simulations and the seed, so anyone can run it again and get the same numbers.
      </p>
    </section>
  );
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
        <ScopePicker
          form={form}
          set={set}
          trenches={trenches}
          contexts={contexts}
          classes={classes}
          spits={spits}
          summary={summary.data}
          loading={summary.isFetching}
          errors={{ ...(summaryError?.fieldErrors ?? {}), ...(startError?.fieldErrors ?? {}) }}
        />
        <details
          className="sheet p-0"
          open={unfolded}
          onToggle={(e) => setUnfolded(e.currentTarget.open)}
          data-testid="run-settings"
        >
          <summary className="min-h-11 cursor-pointer p-3">
            <span className="font-bold">Tests and settings</span>{" "}
            <span className="text-sm text-ink-soft">{unfolded ? "" : `(${describeChoices(form)})`}</span>
          </summary>
          <div className="space-y-4 p-3 pt-0">
            <TestPicker form={form} set={set} summary={summary.data} />
            <ParamsFields form={form} set={set} summary={summary.data} errors={startError?.fieldErrors ?? {}} />
          </div>
        </details>
        {startError && (
          <p className="field-error" role="alert">
            {startError.message}
          </p>
        )}
        {summary.error && (
          <p className="field-error" role="alert">
            {(summary.error as Error).message}
          </p>
        )}
        {canRun ? (
          <button type="submit" className="btn-primary w-full text-lg" disabled={!ready || start.isPending}>
            {start.isPending ? "Starting…" : "Run tests"}
          </button>
        ) : (
          <p className="sheet text-sm">
            Your role can read every saved run; running tests needs the finds specialist or director role.
          </p>
        )}
      </form>
      <div className={`min-w-0 space-y-4 ${runId || compare.length === 2 ? "order-first xl:order-none" : ""}`}>
        {compare.length === 2 ? (
          <CompareView siteId={siteId} ids={compare} onClose={() => setUrl({ compare: [] })} />
        ) : runId ? (
          <RunPanel
            key={runId}
            siteId={siteId}
            runId={runId}
            canRun={canRun}
            onUseSettings={(r) => {
              const next = formFromRun(r);
              setForm(next);
              if (differsFromDefaults(next)) setUnfolded(true);
            }}
            fallback={help}
          />
        ) : (
          help
        )}
        <section className="sheet" aria-labelledby="saved-runs">
          <div className="flex items-center justify-between">
            <h2 id="saved-runs" className="text-lg font-bold">
              Saved runs
            </h2>
            {compare.length === 1 && <p className="text-sm text-ink-soft">Tick one more finished run to compare.</p>}
          </div>
          {runs.data && (
            <RunsList
              runs={runs.data}
              current={runId}
              compare={compare}
              onOpen={(id) => setUrl({ run: id, compare: [] })}
              onToggleCompare={(id) =>
                setUrl({ compare: compare.includes(id) ? compare.filter((x) => x !== id) : [...compare, id].slice(-2) })
              }
            />
          )}
        </section>
      </div>
    </div>
  );
}
