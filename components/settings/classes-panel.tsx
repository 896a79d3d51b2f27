"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient, useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { ClassSymbol } from "@/components/class-symbol";
import { ApiError, apiClient } from "@/lib/api/client";
import type { ClassRow } from "@/lib/api/responses";
import { artefactClassCreateSchema, symbolShapes } from "@/lib/schemas/artefact-class";

type FormIn = z.input<typeof artefactClassCreateSchema>;
type FormOut = z.output<typeof artefactClassCreateSchema>;

/** Okabe & Ito (2008) colour-blind-safe palette, offered first; any #rrggbb is accepted. */
const palette = ["#0072b2", "#56b4e9", "#009e73", "#e69f00", "#d55e00", "#cc79a7", "#f0e442", "#000000"];

function ClassForm({ siteId, editing, onDone }: { siteId: string; editing: ClassRow | null; onDone: () => void }) {
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(artefactClassCreateSchema),
    defaultValues: editing
      ? {
          code: editing.code,
          label: editing.label,
          material: editing.material,
          colour: editing.colour,
          symbol: editing.symbol as FormIn["symbol"],
          humanRemains: editing.humanRemains,
        }
      : { code: "", label: "", material: "", colour: palette[0], symbol: "disc", humanRemains: false },
  });
  const [serverError, setServerError] = useState<string | null>(null);
  const save = useMutation({
    mutationFn: (values: FormOut) =>
      editing
        ? apiClient.call("classUpdate", { siteId, classId: editing.id }, values)
        : apiClient.call("classesCreate", { siteId }, values),
    onSuccess: () => {
      setServerError(null);
      form.reset();
      onDone();
    },
    onError: (err) => {
      setServerError(err.message);
      if (err instanceof ApiError)
        for (const [k, v] of Object.entries(err.fieldErrors))
          form.setError(k as keyof FormIn, { message: v.join(" ") });
    },
  });
  const e = form.formState.errors;
  const colour = form.watch("colour");
  const symbol = form.watch("symbol");
  return (
    <form className="sheet grid gap-3 sm:grid-cols-2" onSubmit={form.handleSubmit((v) => save.mutate(v))} noValidate>
      <h3 className="text-lg font-bold sm:col-span-2">
        {editing ? `Change class ${editing.code}` : "New artefact class"}
      </h3>
      <div>
        <label className="label" htmlFor="cls-code">
          Code
        </label>
        <input id="cls-code" className="field font-mono" {...form.register("code")} aria-invalid={!!e.code} />
        <p className="field-error" aria-live="polite">
          {e.code?.message}
        </p>
      </div>
      <div>
        <label className="label" htmlFor="cls-label">
          Label
        </label>
        <input id="cls-label" className="field" {...form.register("label")} aria-invalid={!!e.label} />
        <p className="field-error" aria-live="polite">
          {e.label?.message}
        </p>
      </div>
      <div>
        <label className="label" htmlFor="cls-material">
          Material
        </label>
        <input id="cls-material" className="field" {...form.register("material")} />
      </div>
      <div>
        <label className="label" htmlFor="cls-symbol">
          Symbol
        </label>
        <select id="cls-symbol" className="field" {...form.register("symbol")}>
          {symbolShapes.map((s) => (
            <option key={s} value={s}>
              {s}
            </option>
          ))}
        </select>
      </div>
      <fieldset className="sm:col-span-2">
        <legend className="label">Colour</legend>
        <div className="flex flex-wrap items-center gap-2">
          {palette.map((c) => (
            <button
              key={c}
              type="button"
              aria-label={`Colour ${c}`}
              aria-pressed={colour === c}
              onClick={() => form.setValue("colour", c, { shouldValidate: true })}
              className={`h-11 w-11 rounded border-2 ${colour === c ? "border-ink ring-2 ring-accent" : "border-ink/30"}`}
              style={{ background: c }}
            />
          ))}
          <input aria-label="Colour as #rrggbb" className="field w-32 font-mono" {...form.register("colour")} />
          <ClassSymbol symbol={String(symbol)} colour={String(colour)} size={32} title="Preview" />
        </div>
        <p className="field-error" aria-live="polite">
          {e.colour?.message}
        </p>
      </fieldset>
      <label className="flex min-h-11 items-center gap-2 sm:col-span-2">
        <input type="checkbox" className="h-6 w-6" {...form.register("humanRemains")} />
        <span>Human remains — finds of this class raise the stop-work caution</span>
      </label>
      <p className="field-error sm:col-span-2" role="alert">
        {serverError}
      </p>
      <div className="flex gap-2 sm:col-span-2">
        <button className="btn-primary" type="submit" disabled={save.isPending}>
          {editing ? "Save class" : "Add class"}
        </button>
        {editing && (
          <button className="btn" type="button" onClick={onDone}>
            Cancel
          </button>
        )}
      </div>
    </form>
  );
}

export function ClassesPanel({ siteId, canEdit }: { siteId: string; canEdit: boolean }) {
  const qc = useQueryClient();
  const key = ["classes", siteId];
  const classes = useQuery({ queryKey: key, queryFn: () => apiClient.call("classesList", { siteId }) });
  const [editing, setEditing] = useState<ClassRow | null>(null);
  return (
    <div className="space-y-4">
      <div className="overflow-x-auto">
        <table className="ledger">
          <thead>
            <tr>
              <th>Symbol</th>
              <th>Code</th>
              <th>Label</th>
              <th>Material</th>
              <th>Flag</th>
              {canEdit && <th />}
            </tr>
          </thead>
          <tbody>
            {classes.data?.map((c) => (
              <tr key={c.id}>
                <td>
                  <ClassSymbol symbol={c.symbol} colour={c.colour} size={20} />
                </td>
                <td className="font-mono">{c.code}</td>
                <td>{c.label}</td>
                <td>{c.material}</td>
                <td>{c.humanRemains ? "human remains" : ""}</td>
                {canEdit && (
                  <td>
                    <button className="btn" onClick={() => setEditing(c)}>
                      Change
                    </button>
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {canEdit && (
        <ClassForm
          key={editing?.id ?? "new"}
          siteId={siteId}
          editing={editing}
          onDone={() => {
            setEditing(null);
            qc.invalidateQueries({ queryKey: key });
          }}
        />
      )}
    </div>
  );
}
