"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { InputField, NumberField, applyFieldErrors } from "@/components/contexts/form-field";
import { ApiError, apiClient } from "@/lib/api/client";
import { benchmarkCreateSchema } from "@/lib/schemas/levels";

type Input = z.input<typeof benchmarkCreateSchema>;
type Output = z.output<typeof benchmarkCreateSchema>;

/** Adds a temporary benchmark: its code, where it is on the site grid and its reduced level on the datum. */
export function BenchmarkForm({ siteId }: { siteId: string }) {
  const [failure, setFailure] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState, reset } = useForm<Input, unknown, Output>({
    resolver: zodResolver(benchmarkCreateSchema),
    defaultValues: { code: "", description: "" },
  });
  const e = formState.errors;
  const submit = handleSubmit(async (values) => {
    setFailure(null);
    try {
      await apiClient.call("benchmarksCreate", { siteId }, values);
      reset({ code: "", description: "" });
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fieldErrors, setError as never)) return;
      setFailure(err instanceof Error ? err.message : String(err));
    }
  });
  const field = (name: keyof Input, label: string, numeric = false) => {
    const Field = numeric ? NumberField : InputField;
    return <Field id={`bm-${name}`} label={label} error={e[name]?.message} {...register(name)} />;
  };
  return (
    <form
      onSubmit={submit}
      noValidate
      className="no-print grid items-end gap-3 sm:grid-cols-6"
      aria-label="Add a benchmark"
    >
      {field("code", "Code")}
      <div className="sm:col-span-2">{field("description", "Description")}</div>
      {field("x", "Easting x (m)", true)}
      {field("y", "Northing y (m)", true)}
      {field("level", "RL (m)", true)}
      <div className="sm:col-span-6">
        <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
          Add the benchmark
        </button>
        <p className="field-error" role="alert" aria-live="assertive">
          {failure ?? ""}
        </p>
      </div>
    </form>
  );
}
