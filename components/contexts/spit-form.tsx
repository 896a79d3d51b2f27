"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { spitCreateSchema } from "@/lib/schemas/levels";
import { ApiError, apiClient } from "@/lib/api/client";
import { applyFieldErrors, InputField } from "./form-field";

type Input = z.input<typeof spitCreateSchema>;
type Output = z.output<typeof spitCreateSchema>;

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
      <InputField
        id="spit-number"
        label="Spit number"
        error={e.number?.message}
        className="field num"
        inputMode="numeric"
        {...register("number")}
      />
      <InputField
        id="spit-top"
        label="Top RL (m)"
        error={e.topLevel?.message}
        className="field num"
        inputMode="decimal"
        {...register("topLevel", blank)}
      />
      <InputField
        id="spit-base"
        label="Base RL (m)"
        error={e.baseLevel?.message}
        className="field num"
        inputMode="decimal"
        {...register("baseLevel", blank)}
      />
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
