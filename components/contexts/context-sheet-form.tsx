"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { contextCreateSchema, contextTypes, digMethods } from "@/lib/schemas/context";
import { ApiError, apiClient } from "@/lib/api/client";
import { applyFieldErrors, FormField, InputField, NumberField } from "./form-field";

type Input = z.input<typeof contextCreateSchema>;
type Output = z.output<typeof contextCreateSchema>;

const textFields = [
  { name: "colour", label: "Colour", rows: 1 },
  { name: "compaction", label: "Compaction", rows: 1 },
  { name: "composition", label: "Composition", rows: 2 },
  { name: "inclusions", label: "Inclusions", rows: 2 },
  { name: "description", label: "Description", rows: 4 },
  { name: "interpretation", label: "Interpretation", rows: 3 },
] as const;

const measureFields = [
  { name: "lengthM", label: "Length (m)" },
  { name: "widthM", label: "Width (m)" },
  { name: "thicknessM", label: "Thickness (m)" },
] as const;

const dateFields = [
  { name: "openedOn", label: "Opened" },
  { name: "closedOn", label: "Closed" },
] as const;

/** The context sheet, checked in the browser by the very schema the server checks it with. */
export function ContextSheetForm({
  siteId,
  trenches,
  initial,
  contextId,
}: {
  siteId: string;
  trenches: { id: string; code: string }[];
  initial?: Partial<Input>;
  contextId?: string;
}) {
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<Input, unknown, Output>({
    resolver: zodResolver(contextCreateSchema),
    defaultValues: { trenchId: trenches[0]?.id, type: "layer", ...initial },
  });
  const e = formState.errors;

  const submit = handleSubmit(async (values) => {
    setFailure(null);
    try {
      if (contextId) {
        const { trenchId: _fixed, ...changes } = values;
        await apiClient.call("contextUpdate", { siteId, contextId }, changes);
      } else {
        const made = await apiClient.call("contextsCreate", { siteId }, values);
        router.push(`/sites/${siteId}/contexts/${made.id}`);
      }
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fieldErrors, setError as never)) return;
      setFailure(err instanceof Error ? err.message : String(err));
    }
  });

  return (
    <form onSubmit={submit} noValidate className="sheet space-y-3" aria-label="Context sheet">
      <div className="grid gap-3 sm:grid-cols-3">
        <NumberField
          id="ctx-number"
          label="Context number"
          error={e.number?.message}
          whole
          aria-invalid={!!e.number}
          {...register("number")}
        />
        <FormField id="ctx-type" label="Type" error={e.type?.message}>
          <select id="ctx-type" className="field" aria-describedby="ctx-type-error" {...register("type")}>
            {contextTypes.map((t) => (
              <option key={t} value={t}>
                {t}
              </option>
            ))}
          </select>
        </FormField>
        <FormField
          id="ctx-trench"
          label="Trench"
          error={e.trenchId?.message}
          hint={contextId ? "A context stays in the trench it was opened in." : undefined}
        >
          {contextId ? (
            // A saved sheet's trench is shown, not offered: a context stays in the trench it was opened in.
            <output id="ctx-trench" className="field block bg-paper-deep" aria-describedby="ctx-trench-hint">
              Trench {trenches.find((t) => t.id === initial?.trenchId)?.code ?? "?"}
            </output>
          ) : (
            <select id="ctx-trench" className="field" aria-describedby="ctx-trench-error" {...register("trenchId")}>
              {trenches.map((t) => (
                <option key={t.id} value={t.id}>
                  Trench {t.code}
                </option>
              ))}
            </select>
          )}
        </FormField>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        {textFields.map((f) =>
          f.rows === 1 ? (
            <InputField
              key={f.name}
              id={`ctx-${f.name}`}
              label={f.label}
              error={e[f.name]?.message}
              {...register(f.name)}
            />
          ) : (
            <FormField key={f.name} id={`ctx-${f.name}`} label={f.label} error={e[f.name]?.message}>
              <textarea
                id={`ctx-${f.name}`}
                className="field"
                rows={f.rows}
                aria-describedby={`ctx-${f.name}-error`}
                {...register(f.name)}
              />
            </FormField>
          ),
        )}
      </div>
      <fieldset className="grid gap-3 sm:grid-cols-4">
        <legend className="label">Dimensions and digging</legend>
        {measureFields.map((f) => (
          <NumberField
            key={f.name}
            id={`ctx-${f.name}`}
            label={f.label}
            error={e[f.name]?.message}
            {...register(f.name)}
          />
        ))}
        <InputField
          id="ctx-excavatedBy"
          label="Excavated by"
          error={e.excavatedBy?.message}
          {...register("excavatedBy")}
        />
        {dateFields.map((f) => (
          <InputField
            key={f.name}
            id={`ctx-${f.name}`}
            label={f.label}
            error={e[f.name]?.message}
            type="date"
            className="field num"
            {...register(f.name)}
          />
        ))}
        <FormField id="ctx-digMethod" label="Dug by" error={e.digMethod?.message}>
          <select
            id="ctx-digMethod"
            className="field"
            aria-describedby="ctx-digMethod-error"
            {...register("digMethod")}
          >
            <option value="">not recorded</option>
            {digMethods.map((m) => (
              <option key={m} value={m}>
                {m}
              </option>
            ))}
          </select>
        </FormField>
        <NumberField
          id="ctx-sieveMeshMm"
          label="Sieve mesh (mm)"
          error={e.sieveMeshMm?.message}
          {...register("sieveMeshMm")}
        />
      </fieldset>
      <p className="field-error" role="alert" aria-live="assertive">
        {failure ?? ""}
      </p>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
        {contextId ? "Save the sheet" : "Open the sheet"}
      </button>
    </form>
  );
}
