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
          Projected CRS the site is placed in (OGC WKT or a proj4 definition, optional)
        </label>
        <textarea
          id="site-crs"
          className="field min-h-24 font-mono text-sm"
          disabled={!canEdit}
          placeholder='PROJCS["OSGB36 / British National Grid", … AUTHORITY["EPSG","27700"]]'
          {...form.register("crs")}
        />
        <p className="text-sm text-ink-soft">
          The grid's axes are taken as parallel to this system's, with the origin above. Placed, the site's GIS exports
          also come in this system and in WGS 84 (GeoJSON is WGS 84 only). Give the WKT (as the EPSG registry publishes
          it) for the GeoPackage to name the system by its EPSG code; a bare proj4 definition places the WGS 84 layers
          only.
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
