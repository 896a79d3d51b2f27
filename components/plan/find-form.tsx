"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import type { Pt } from "@/lib/geometry/outline-edit";
import { findFormSchema } from "@/lib/schemas/find";
import type { ClassRow, ContextRow } from "./rows";

/** The quick form checks with the find's own rules (lib/schemas/find.ts); the server checks them again. */
export type QuickFind = z.output<typeof findFormSchema>;
type QuickFindInput = z.input<typeof findFormSchema>;

export function FindForm({
  at,
  classes,
  contexts,
  defaults,
  busy,
  serverError,
  onSubmit,
  onCancel,
}: {
  at: Pt;
  classes: ClassRow[];
  contexts: ContextRow[];
  defaults: Partial<Pick<QuickFindInput, "classId" | "contextId">>;
  busy: boolean;
  serverError: string | null;
  onSubmit: (v: QuickFind) => void;
  onCancel: () => void;
}) {
  const { register, handleSubmit, formState } = useForm<QuickFindInput, unknown, QuickFind>({
    resolver: zodResolver(findFormSchema),
    defaultValues: { classId: "", contextId: "", z: "", count: "", weightG: "", description: "", ...defaults },
  });
  const err = formState.errors;
  return (
    <form onSubmit={handleSubmit(onSubmit)} className="space-y-3" aria-label="New find">
      <p className="num text-sm">
        at x {at[0].toFixed(3)} · y {at[1].toFixed(3)} m
      </p>
      <div>
        <label className="label" htmlFor="ff-class">
          Class
        </label>
        <select id="ff-class" className="field" {...register("classId")} autoFocus>
          <option value="">— pick —</option>
          {classes.map((c) => (
            <option key={c.id} value={c.id}>
              {c.code} · {c.label}
            </option>
          ))}
        </select>
        {err.classId && (
          <p className="field-error" aria-live="polite">
            {err.classId.message}
          </p>
        )}
      </div>
      <div>
        <label className="label" htmlFor="ff-context">
          Context
        </label>
        <select id="ff-context" className="field" {...register("contextId")}>
          <option value="">— pick —</option>
          {contexts.map((c) => (
            <option key={c.id} value={c.id} disabled={c.state === "signed_off"}>
              {c.number} · {c.type}
              {c.state === "signed_off" ? " (signed off)" : c.state === "awaiting" ? " (awaiting sign-off)" : ""}
            </option>
          ))}
        </select>
        {err.contextId && (
          <p className="field-error" aria-live="polite">
            {err.contextId.message}
          </p>
        )}
      </div>
      <div className="grid grid-cols-3 gap-2">
        <div>
          <label className="label" htmlFor="ff-z" title="Reduced level: metres above the site datum">
            RL (m, site datum)
          </label>
          <input id="ff-z" className="field num" inputMode="decimal" {...register("z")} />
          {err.z && <p className="field-error">{err.z.message}</p>}
        </div>
        <div>
          <label className="label" htmlFor="ff-count">
            Count
          </label>
          <input id="ff-count" className="field num" inputMode="numeric" {...register("count")} />
          {err.count && <p className="field-error">{err.count.message}</p>}
        </div>
        <div>
          <label className="label" htmlFor="ff-weight">
            Weight (g)
          </label>
          <input id="ff-weight" className="field num" inputMode="decimal" {...register("weightG")} />
          {err.weightG && <p className="field-error">{err.weightG.message}</p>}
        </div>
      </div>
      <div>
        <label className="label" htmlFor="ff-desc">
          Description
        </label>
        <textarea id="ff-desc" className="field" rows={2} {...register("description")} />
      </div>
      {serverError && (
        <p role="alert" className="rounded border-2 border-warn bg-warn-light p-2 font-semibold text-warn">
          {serverError}
        </p>
      )}
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? "Recording…" : "Record find"}
        </button>
        <button type="button" className="btn" onClick={onCancel}>
          Cancel
        </button>
      </div>
    </form>
  );
}
