"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { ApiError, apiClient } from "@/lib/api/client";
import { siteUpdateSchema } from "@/lib/schemas/site";

type In = z.input<typeof siteUpdateSchema>;
type Out = z.output<typeof siteUpdateSchema>;

export function GridForm({ siteId, initial, canEdit }: { siteId: string; initial: In; canEdit: boolean }) {
  const form = useForm<In, unknown, Out>({ resolver: zodResolver(siteUpdateSchema), defaultValues: initial });
  const save = useMutation({
    mutationFn: (v: Out) => apiClient.call("siteUpdate", { siteId }, v),
    onError: (err) => {
      if (err instanceof ApiError)
        for (const [k, v] of Object.entries(err.fieldErrors)) form.setError(k as keyof In, { message: v.join(" ") });
    },
  });
  const e = form.formState.errors;
  const field = (name: keyof In, label: string, props: Record<string, unknown> = {}) => (
    <div>
      <label className="label" htmlFor={`site-${name}`}>
        {label}
      </label>
      <input id={`site-${name}`} className="field" disabled={!canEdit} {...form.register(name)} {...props} />
      <p className="field-error" aria-live="polite">
        {e[name]?.message as string | undefined}
      </p>
    </div>
  );
  return (
    <form className="sheet grid gap-3 sm:grid-cols-2" onSubmit={form.handleSubmit((v) => save.mutate(v))} noValidate>
      {field("name", "Site name")}
      <div className="sm:col-span-2">
        <label className="label" htmlFor="site-grid">
          How the site grid is laid out
        </label>
        <textarea id="site-grid" className="field min-h-24" disabled={!canEdit} {...form.register("gridDescription")} />
      </div>
      {field("gridOriginX", "Grid origin easting (m)", { inputMode: "decimal", className: "field font-mono" })}
      {field("gridOriginY", "Grid origin northing (m)", { inputMode: "decimal", className: "field font-mono" })}
      <div className="sm:col-span-2">
        <label className="label" htmlFor="site-crs">
          Projected CRS for export (proj4 definition, optional)
        </label>
        <input
          id="site-crs"
          className="field font-mono text-sm"
          disabled={!canEdit}
          placeholder="+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +units=m +no_defs"
          {...form.register("crs")}
        />
        <p className="text-sm text-ink-soft">
          Grid coordinates are shifted by the origin above into this system when finds are exported as projected
          GeoJSON.
        </p>
        <p className="field-error" aria-live="polite">
          {e.crs?.message}
        </p>
      </div>
      {canEdit && (
        <div className="sm:col-span-2 flex items-center gap-3">
          <button className="btn-primary" type="submit" disabled={save.isPending}>
            Save grid
          </button>
          <span aria-live="polite" className="text-sm">
            {save.isSuccess
              ? "Saved."
              : save.error && !(save.error instanceof ApiError && save.error.hasFieldErrors)
                ? save.error.message
                : ""}
          </span>
        </div>
      )}
    </form>
  );
}
