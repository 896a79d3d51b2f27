"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { findUpdateSchema } from "@/lib/schemas/find";
import { applyFieldErrors, FormField, NumberField } from "@/components/contexts/form-field";
import { ApiError, apiClient } from "@/lib/api/client";

type Input = z.input<typeof findUpdateSchema>;
type Output = z.output<typeof findUpdateSchema>;

/**
 * Editing a find with the server's own schema; the number is the server's and never changes. Only the
 * fields this person may change are editable (a specialist re-classes), and only the changed ones are sent.
 */
export function FindEditForm({
  siteId,
  findId,
  initial,
  contexts,
  classes,
  changeable,
}: {
  siteId: string;
  findId: string;
  initial: Input;
  contexts: { id: string; number: number }[];
  classes: { id: string; code: string; label: string }[];
  changeable: string[];
}) {
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<Input, unknown, Output>({
    resolver: zodResolver(findUpdateSchema),
    defaultValues: initial,
  });
  const e = formState.errors;
  const locked = (name: keyof Output) => !changeable.includes(name);
  const submit = handleSubmit(async (values) => {
    setNote(null);
    const dirty = formState.dirtyFields as Partial<Record<keyof Output, boolean>>;
    const changes = Object.fromEntries(
      Object.entries(values).filter(([k]) => dirty[k as keyof Output] && !locked(k as keyof Output)),
    );
    try {
      const saved = await apiClient.call("findUpdate", { siteId, findId }, changes);
      setNote(saved.levelWarning ? { ok: false, text: saved.levelWarning } : { ok: true, text: "Saved." });
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fieldErrors, setError as never)) return;
      setNote({ ok: false, text: err instanceof Error ? err.message : String(err) });
    }
  });
  const num = (name: "x" | "y" | "z" | "count" | "weightG", label: string) => (
    <NumberField
      id={`find-${name}`}
      label={label}
      error={e[name]?.message}
      {...register(name)}
      disabled={locked(name)}
    />
  );
  return (
    <form onSubmit={submit} noValidate className="sheet space-y-3" aria-label="Edit the find">
      <div className="grid gap-3 sm:grid-cols-2">
        <FormField id="find-context" label="Context" error={e.contextId?.message}>
          <select id="find-context" className="field num" {...register("contextId")} disabled={locked("contextId")}>
            {contexts.map((c) => (
              <option key={c.id} value={c.id}>
                {c.number}
              </option>
            ))}
          </select>
        </FormField>
        <FormField id="find-class" label="Class" error={e.classId?.message}>
          <select id="find-class" className="field" {...register("classId")} disabled={locked("classId")}>
            {classes.map((c) => (
              <option key={c.id} value={c.id}>
                {c.code} · {c.label}
              </option>
            ))}
          </select>
        </FormField>
      </div>
      <div className="grid gap-3 sm:grid-cols-5">
        {num("x", "x (m)")}
        {num("y", "y (m)")}
        {num("z", "Reduced level (m, site datum)")}
        {num("count", "Count")}
        {num("weightG", "Weight (g)")}
      </div>
      <FormField id="find-description" label="Description" error={e.description?.message}>
        <textarea
          id="find-description"
          className="field"
          rows={3}
          {...register("description")}
          disabled={locked("description")}
        />
      </FormField>
      <p role="status" aria-live="polite" className={note?.ok ? "font-semibold text-ok" : "field-error"}>
        {note?.text ?? ""}
      </p>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
        Save the find
      </button>
    </form>
  );
}
