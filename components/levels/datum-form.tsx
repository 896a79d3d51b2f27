"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { FormField, applyFieldErrors } from "@/components/contexts/form-field";
import { ApiError, apiClient } from "@/lib/api/client";
import { datumUpdateSchema } from "@/lib/schemas/levels";

type Input = z.input<typeof datumUpdateSchema>;
type Output = z.output<typeof datumUpdateSchema>;

/** The director states what heights are measured from and how far a closed run may miss its benchmark. */
export function DatumForm({
  siteId,
  initial,
}: {
  siteId: string;
  initial: { datumKind: "national" | "local"; datumName: string; levelTolerance: number };
}) {
  const [note, setNote] = useState("");
  const { register, handleSubmit, setError, formState } = useForm<Input, unknown, Output>({
    resolver: zodResolver(datumUpdateSchema),
    defaultValues: initial,
  });
  const e = formState.errors;
  const submit = handleSubmit(async (values) => {
    setNote("");
    try {
      await apiClient.call("datumUpdate", { siteId }, values);
      setNote("Saved.");
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fieldErrors, setError as never)) return;
      setNote(err instanceof Error ? err.message : String(err));
    }
  });
  return (
    <form onSubmit={submit} noValidate className="no-print grid items-end gap-3 sm:grid-cols-4" aria-label="Site datum">
      <FormField id="datum-kind" label="Datum" error={e.datumKind?.message}>
        <select id="datum-kind" className="field" {...register("datumKind")}>
          <option value="local">local site datum</option>
          <option value="national">national datum</option>
        </select>
      </FormField>
      <div className="sm:col-span-2">
        <FormField id="datum-name" label="Name of the datum" error={e.datumName?.message}>
          <input id="datum-name" className="field" aria-describedby="datum-name-error" {...register("datumName")} />
        </FormField>
      </div>
      <FormField
        id="datum-tolerance"
        label="Closing tolerance (m)"
        error={e.levelTolerance?.message}
        hint="Common practice on a site: a few millimetres."
      >
        <input
          id="datum-tolerance"
          className="field num"
          inputMode="decimal"
          aria-describedby="datum-tolerance-error datum-tolerance-hint"
          {...register("levelTolerance")}
        />
      </FormField>
      <div className="sm:col-span-4">
        <button type="submit" className="btn" disabled={formState.isSubmitting}>
          Save the datum
        </button>
        <span className="ml-3 text-sm" role="status" aria-live="polite">
          {note}
        </span>
      </div>
    </form>
  );
}
