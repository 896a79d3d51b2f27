"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { spitCreateSchema } from "@/lib/schemas/levels";
import { ApiError, apiClient } from "@/lib/api/client";
import { applyFieldErrors, NumberField } from "./form-field";

type Input = z.input<typeof spitCreateSchema>;
type Output = z.output<typeof spitCreateSchema>;

/** The spit's top and base, each a reduced level that may be left blank until the spit is levelled. */
const levelFields = [
  { name: "topLevel", id: "spit-top", label: "Top RL (m)" },
  { name: "baseLevel", id: "spit-base", label: "Base RL (m)" },
] as const;

/** Adds a spit to the context: its number from the top and, when levelled, its top and base reduced levels. */
export function SpitForm({ siteId, contextId, nextNumber }: { siteId: string; contextId: string; nextNumber: number }) {
  const [failure, setFailure] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState, reset } = useForm<Input, unknown, Output>({
    resolver: zodResolver(spitCreateSchema),
    defaultValues: { number: nextNumber },
  });
  const e = formState.errors;
  const submit = handleSubmit(async (values) => {
    setFailure(null);
    try {
      await apiClient.call("spitsCreate", { siteId, contextId }, values);
      reset({ number: nextNumber + 1 });
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fieldErrors, setError as never)) return;
      setFailure(err instanceof Error ? err.message : String(err));
    }
  });
  const blank = { setValueAs: (v: unknown) => (v === "" ? null : v) };
  return (
    <form onSubmit={submit} noValidate className="grid items-end gap-3 sm:grid-cols-4" aria-label="Add a spit">
      <NumberField id="spit-number" label="Spit number" error={e.number?.message} whole {...register("number")} />
      {levelFields.map((f) => (
        <NumberField key={f.name} id={f.id} label={f.label} error={e[f.name]?.message} {...register(f.name, blank)} />
      ))}
      <div>
        <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
          Add the spit
        </button>
        <p className="field-error" role="alert" aria-live="assertive">
          {failure ?? ""}
        </p>
      </div>
    </form>
  );
}
