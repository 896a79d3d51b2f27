"use client";

import { ClassSymbol } from "@/components/class-symbol";
import type { ScopeSummary } from "@/lib/api/patterns-responses";
import { DepthFields, SpreadSummary } from "./depth-fields";
import type { FormState } from "./form-state";
import type { ClassOption, ContextOption, SpitOption, TrenchOption } from "./types";

type Props = {
  form: FormState;
  set: (f: Partial<FormState>) => void;
  trenches: TrenchOption[];
  contexts: ContextOption[];
  classes: ClassOption[];
  spits: SpitOption[];
  summary: ScopeSummary | undefined;
  loading: boolean;
  /** Field messages from the server, keyed by field ("levelFrom", "scope.levelFrom", …). */
  errors: Record<string, string[]>;
};

const toggle = (list: string[], id: string, on: boolean) =>
  on ? [...new Set([...list, id])] : list.filter((x) => x !== id);

/** Step 1: one trench (the study area), the contexts that form one surface, the classes; n per class. */
export function ScopePicker({ form, set, trenches, contexts, classes, spits, summary, loading, errors }: Props) {
  const inTrench = contexts.filter((c) => c.trenchId === form.trenchId);
  const nOf = new Map(summary?.classes.map((c) => [c.id, c]) ?? []);
  return (
    <fieldset className="sheet space-y-3">
      <legend className="px-1 text-lg font-bold">1 · Scope</legend>
      <label className="block">
        <span className="label">Trench (its outline is the study area)</span>
        <select
          className="field"
          value={form.trenchId}
          onChange={(e) => set({ trenchId: e.target.value, contextIds: [], spitIds: [] })}
        >
          {trenches.map((t) => (
            <option key={t.id} value={t.id}>
              Trench {t.code}
              {t.name ? ` — ${t.name}` : ""}
            </option>
          ))}
        </select>
      </label>
      <div>
        <p className="label">Contexts that form one surface or deposit</p>
        {inTrench.length === 0 && <p className="text-sm text-ink-soft">This trench has no context sheets yet.</p>}
        <ul className="grid gap-1">
          {inTrench.map((c) => (
            <li key={c.id}>
              <label className="flex min-h-11 items-center gap-2 rounded px-2 hover:bg-paper-deep">
                <input
                  type="checkbox"
                  className="size-5"
                  checked={form.contextIds.includes(c.id)}
                  onChange={(e) =>
                    set({
                      contextIds: toggle(form.contextIds, c.id, e.target.checked),
                      // A context taken out of the scope takes its spits with it.
                      spitIds: e.target.checked
                        ? form.spitIds
                        : form.spitIds.filter((s) => spits.find((x) => x.id === s)?.contextId !== c.id),
                    })
                  }
                />
                <span className="num font-bold">{c.number}</span>
                <span className="text-sm text-ink-soft">
                  {c.type}
                  {c.interpretation ? ` · ${c.interpretation}` : ""}
                </span>
              </label>
            </li>
          ))}
        </ul>
      </div>
      {summary && summary.warnings.length > 0 && (
        <div role="alert" className="rounded border-2 border-warn bg-warn-light p-2 text-sm text-warn">
          <p className="font-bold">These contexts may not be one surface</p>
          <ul className="list-disc pl-5">
            {summary.warnings.map((w, i) => (
              <li key={i}>{w.message}</li>
            ))}
          </ul>
          <p>Finds from several contexts projected onto one plan mix different moments in time.</p>
        </div>
      )}
      <DepthFields form={form} set={set} contexts={inTrench} spits={spits} summary={summary} errors={errors} />
      <div>
        <p className="label">Classes {loading && <span className="font-normal">(counting…)</span>}</p>
        <ul className="grid gap-1">
          {classes.map((c) => {
            const s = nOf.get(c.id);
            return (
              <li key={c.id}>
                <label className="flex min-h-11 items-center gap-2 rounded px-2 hover:bg-paper-deep">
                  <input
                    type="checkbox"
                    className="size-5"
                    checked={form.classIds.includes(c.id)}
                    onChange={(e) => set({ classIds: toggle(form.classIds, c.id, e.target.checked) })}
                  />
                  <ClassSymbol symbol={c.symbol} colour={c.colour} />
                  <span className="font-bold">{c.code}</span>
                  <span className="text-sm text-ink-soft">{c.label}</span>
                  <span
                    className={`num ml-auto text-sm ${s && s.n < 20 ? "font-bold text-warn" : ""}`}
                    title="Finds of this class in the chosen contexts"
                    data-testid={`n-${c.code}`}
                  >
                    {s ? `n = ${s.n}` : form.contextIds.length ? "…" : ""}
                  </span>
                </label>
              </li>
            );
          })}
        </ul>
        {summary && (
          <p className="mt-1 text-xs text-ink-soft">
            Below 20 finds a class gives little power; below the minimum a test needs, Loamwork refuses that test.
          </p>
        )}
        {summary && <SpreadSummary summary={summary} chosen={form.classIds} />}
      </div>
    </fieldset>
  );
}
