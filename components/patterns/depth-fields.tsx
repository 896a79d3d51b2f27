"use client";

import { depthWords, leftOutWords } from "@/lib/levels/depth-words";
import type { ScopeSummary } from "@/lib/api/patterns-responses";
import type { FormState } from "./form-state";
import type { ContextOption, SpitOption } from "./types";
import { VerticalSpreadPlot } from "./vertical-spread-plot";

type Props = {
  form: FormState;
  set: (f: Partial<FormState>) => void;
  /** The contexts of the chosen trench. */
  contexts: ContextOption[];
  spits: SpitOption[];
  summary: ScopeSummary | undefined;
  errors: Record<string, string[]>;
};

const rl = (v: number | null) => (v === null ? "—" : v.toFixed(3));
const errorOf = (errors: Record<string, string[]>, field: string) =>
  (errors[field] ?? errors[`scope.${field}`] ?? []).join(" ");

/** The two ends of the range of reduced levels. */
const levelFields = [
  { key: "levelFrom", id: "scope-level-from", label: "Lowest level (RL, m)", placeholder: "e.g. 41.150" },
  { key: "levelTo", id: "scope-level-to", label: "Highest level (RL, m)", placeholder: "e.g. 41.350" },
] as const;

/** Depth limits of the scope: a range of reduced levels and/or chosen spits of the chosen contexts. */
export function DepthFields({ form, set, contexts, spits, summary, errors }: Props) {
  const chosen = contexts.filter((c) => form.contextIds.includes(c.id));
  const offered = chosen.flatMap((c) => spits.filter((s) => s.contextId === c.id).map((s) => ({ s, c })));
  const spitError = errorOf(errors, "spitIds");
  const d = summary?.depth;
  return (
    <fieldset className="space-y-2 rounded border border-ink/20 p-2">
      <legend className="px-1 font-bold">Depth (optional)</legend>
      <p className="text-sm text-ink-soft">
        Levels are reduced levels (RL): metres above the site datum. Leave both blank to take every find of the
        contexts.
      </p>
      <div className="grid grid-cols-2 gap-2">
        {levelFields.map((f) => {
          const error = errorOf(errors, f.key);
          return (
            <div key={f.key}>
              <label className="label" htmlFor={f.id}>
                {f.label}
              </label>
              <input
                id={f.id}
                className="field num"
                inputMode="decimal"
                placeholder={f.placeholder}
                value={form[f.key]}
                onChange={(e) => set({ [f.key]: e.target.value })}
                aria-describedby={`${f.id}-error`}
                aria-invalid={error ? true : undefined}
              />
              <p id={`${f.id}-error`} className="field-error" aria-live="polite">
                {error}
              </p>
            </div>
          );
        })}
      </div>
      {offered.length > 0 && (
        <div>
          <p className="label" id="scope-spits-label">
            Only the finds recorded in these spits
          </p>
          <ul className="grid grid-cols-2 gap-1" aria-labelledby="scope-spits-label">
            {offered.map(({ s, c }) => (
              <li key={s.id}>
                <label className="flex min-h-11 items-center gap-2 rounded px-2 hover:bg-paper-deep">
                  <input
                    type="checkbox"
                    className="size-5"
                    checked={form.spitIds.includes(s.id)}
                    onChange={(e) =>
                      set({
                        spitIds: e.target.checked
                          ? [...new Set([...form.spitIds, s.id])]
                          : form.spitIds.filter((x) => x !== s.id),
                      })
                    }
                  />
                  <span className="num font-bold">
                    {c.number}/{s.number}
                  </span>
                  <span className="num text-xs text-ink-soft">
                    RL {rl(s.topLevel)}–{rl(s.baseLevel)}
                  </span>
                </label>
              </li>
            ))}
          </ul>
          <p className="field-error" aria-live="polite">
            {spitError}
          </p>
        </div>
      )}
      {d && (
        <div className="text-sm" data-testid="depth-scope">
          <p>
            Limited to <b>{depthWords(d)}</b>.
          </p>
          {d.noLevel.count > 0 && (
            <p className="font-semibold text-warn">
              {leftOutWords("with no level recorded", d.noLevel.numbers)} (a find with no level has none; it is not
              taken as 0).
            </p>
          )}
          {d.noSpit.count > 0 && (
            <p className="font-semibold text-warn">{leftOutWords("recorded in no spit", d.noSpit.numbers)}.</p>
          )}
        </div>
      )}
    </fieldset>
  );
}

/** Per class, the vertical spread of its finds in scope, and a caution where it may mix several surfaces. */
export function SpreadSummary({ summary, chosen }: { summary: ScopeSummary; chosen: string[] }) {
  const classes = summary.classes.filter((c) => chosen.includes(c.id));
  if (!classes.length) return null;
  const { threshold, isDefault } = summary.spreadCaution;
  const limit = `${threshold.toFixed(2)} m${isDefault ? " (common practice)" : " (set for this site)"}`;
  const mixed = classes.filter((c) => c.vertical.mixes);
  const noLevel = classes.filter((c) => c.vertical.withLevel < c.vertical.n);
  return (
    <section className="mt-3" aria-labelledby="vertical-spread-h">
      <h3 id="vertical-spread-h" className="label">
        Vertical spread of each class
      </h3>
      <VerticalSpreadPlot classes={classes} threshold={threshold} />
      {mixed.length > 0 && (
        <div role="alert" className="mt-2 rounded border-2 border-warn bg-warn-light p-2 text-sm text-warn">
          <p className="font-bold">These finds may come from several surfaces</p>
          <ul className="list-disc pl-5">
            {mixed.map((c) => (
              <li key={c.id}>
                {c.code}: spread over {c.vertical.spread!.toFixed(2)} m, RL {rl(c.vertical.min)} to {rl(c.vertical.max)}
                — more than {limit}.
              </li>
            ))}
          </ul>
          <p>Limit the scope by level or by spit to study one surface at a time.</p>
        </div>
      )}
      {mixed.length === 0 && (
        <p className="mt-1 text-xs text-ink-soft">
          No class spreads over more than {limit} from its lowest to its highest find.
        </p>
      )}
      {noLevel.length > 0 && (
        <p className="mt-1 text-xs text-ink-soft">
          With no level recorded:{" "}
          {noLevel.map((c) => `${c.code} ${c.vertical.n - c.vertical.withLevel} of ${c.vertical.n}`).join(", ")} (not
          drawn, not taken as 0).
        </p>
      )}
    </section>
  );
}
