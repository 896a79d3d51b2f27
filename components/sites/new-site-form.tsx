"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { ApiError, apiClient } from "@/lib/api/client";
import { siteCreateSchema } from "@/lib/schemas/site";

type In = z.input<typeof siteCreateSchema>;
type Out = z.output<typeof siteCreateSchema>;

/** Opens a new site; the person who opens it becomes its director. */
export function NewSiteForm() {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const form = useForm<In, unknown, Out>({
    resolver: zodResolver(siteCreateSchema),
    defaultValues: { code: "", name: "", gridDescription: "" },
  });
  const create = useMutation({
    mutationFn: (v: Out) => apiClient.call("sitesCreate", {}, v),
    onSuccess: (site) => router.push(`/sites/${site.id}`),
    onError: (err) => {
      if (err instanceof ApiError) {
        for (const [k, v] of Object.entries(err.fieldErrors)) form.setError(k as keyof In, { message: v.join(" ") });
        if (!err.hasFieldErrors) form.setError("code", { message: err.message });
      }
    },
  });
  const e = form.formState.errors;
  if (!open)
    return (
      <button className="btn" onClick={() => setOpen(true)}>
        Open a new site
      </button>
    );
  return (
    <form className="sheet grid max-w-xl gap-3" onSubmit={form.handleSubmit((v) => create.mutate(v))} noValidate>
      <h2 className="text-lg font-bold">New site</h2>
      <div>
        <label className="label" htmlFor="new-code">
          Site code
        </label>
        <input id="new-code" className="field font-mono" {...form.register("code")} />
        <p className="field-error" aria-live="polite">
          {e.code?.message}
        </p>
      </div>
      <div>
        <label className="label" htmlFor="new-name">
          Name
        </label>
        <input id="new-name" className="field" {...form.register("name")} />
        <p className="field-error" aria-live="polite">
          {e.name?.message}
        </p>
      </div>
      <div>
        <label className="label" htmlFor="new-grid">
          Site grid (origin, axes, units are metres)
        </label>
        <textarea id="new-grid" className="field min-h-20" {...form.register("gridDescription")} />
      </div>
      <p className="text-sm text-ink-soft">You will be the site&apos;s director and can add people afterwards.</p>
      <div className="flex gap-2">
        <button className="btn-primary" type="submit" disabled={create.isPending}>
          Open site
        </button>
        <button className="btn" type="button" onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
    </form>
  );
}
