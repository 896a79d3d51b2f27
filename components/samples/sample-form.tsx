"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { applyFieldErrors, FormField } from "@/components/contexts/form-field";
import { ApiError, apiClient } from "@/lib/api/client";
import { sampleCreateSchema, sampleTypeLabels, sampleTypes } from "@/lib/schemas/sample";

type Input = z.input<typeof sampleCreateSchema>;
type Output = z.output<typeof sampleCreateSchema>;

/**
 * The sample sheet, checked in the browser by the schema the server uses. The number is the server's: it is
 * shown once the sample is recorded. Editing sends only the fields changed.
 */
export function SampleForm({
  siteId,
  sampleId,
  contexts,
  members,
  initial,
}: {
  siteId: string;
  sampleId?: string;
  contexts: { id: string; number: number; trenchCode: string }[];
  members: { id: string; name: string }[];
  initial: Partial<Input>;
}) {
  const router = useRouter();
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<Input, unknown, Output>({
    resolver: zodResolver(sampleCreateSchema),
    defaultValues: { type: "bulk", ...initial },
  });
  const e = formState.errors;
  const submit = handleSubmit(async (values) => {
    setNote(null);
    try {
      if (sampleId) {
        const dirty = formState.dirtyFields as Partial<Record<keyof Output, boolean>>;
        const changes = Object.fromEntries(Object.entries(values).filter(([k]) => dirty[k as keyof Output]));
        await apiClient.call("sampleUpdate", { siteId, sampleId }, changes);
        setNote({ ok: true, text: "Saved." });
        router.refresh();
      } else {
        const made = await apiClient.call("samplesCreate", { siteId }, values);
        router.push(`/sites/${siteId}/samples/${made.id}`);
      }
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fieldErrors, setError as never)) return;
      setNote({ ok: false, text: err instanceof Error ? err.message : String(err) });
    }
  });
  const num = (name: "spit" | "x" | "y" | "z" | "volumeL", label: string, hint?: string) => (
    <FormField id={`sample-${name}`} label={label} error={e[name]?.message} hint={hint}>
      <input
        id={`sample-${name}`}
        className="field num"
        inputMode="decimal"
        aria-describedby={`sample-${name}-error`}
        {...register(name)}
      />
    </FormField>
  );
  return (
    <form onSubmit={submit} noValidate className="sheet space-y-3" aria-label="Sample sheet">
      <div className="grid gap-3 sm:grid-cols-3">
        <FormField id="sample-context" label="Context" error={e.contextId?.message}>
          <select id="sample-context" className="field num" {...register("contextId")}>
            <option value="">—</option>
            {contexts.map((c) => (
              <option key={c.id} value={c.id}>
                {c.number} (trench {c.trenchCode})
              </option>
            ))}
          </select>
        </FormField>
        {num("spit", "Spit (number, optional)", "From the top of the context, as on its sheet.")}
        <FormField id="sample-type" label="Kind of sample" error={e.type?.message}>
          <select id="sample-type" className="field" {...register("type")}>
            {sampleTypes.map((t) => (
              <option key={t} value={t}>
                {sampleTypeLabels[t]}
              </option>
            ))}
          </select>
        </FormField>
      </div>
      <div className="grid gap-3 sm:grid-cols-4">
        {num("x", "x (m, optional)")}
        {num("y", "y (m, optional)")}
        {num("z", "Reduced level (m, site datum)")}
        {num("volumeL", "Volume (litres)")}
      </div>
      <FormField id="sample-purpose" label="Purpose" error={e.purpose?.message}>
        <textarea
          id="sample-purpose"
          className="field"
          rows={2}
          placeholder="e.g. charred plant remains from the hearth fill"
          {...register("purpose")}
        />
      </FormField>
      <div className="grid gap-3 sm:grid-cols-2">
        <FormField id="sample-taken-by" label="Taken by" error={e.takenBy?.message}>
          <select id="sample-taken-by" className="field" {...register("takenBy")}>
            <option value="">Me</option>
            {members.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
        </FormField>
        <FormField id="sample-taken-on" label="Taken on" error={e.takenOn?.message} hint="Blank = today.">
          <input
            id="sample-taken-on"
            type="date"
            className="field num"
            {...register("takenOn", { setValueAs: (v) => (v === "" ? undefined : v) })}
          />
        </FormField>
      </div>
      <p className="text-sm text-ink-soft">
        Sampling ground that may be contaminated (fuel, asbestos, industrial waste) follows the site&apos;s risk
        assessment and safety rules: gloves, sealed bags, and the director told before the sample leaves the trench.
      </p>
      <p role="status" aria-live="polite" className={note?.ok ? "font-semibold text-ok" : "field-error"}>
        {note?.text ?? ""}
      </p>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
        {sampleId ? "Save the sample" : "Record the sample"}
      </button>
    </form>
  );
}
