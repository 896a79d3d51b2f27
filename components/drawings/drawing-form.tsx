"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { applyFieldErrors, FormField } from "@/components/contexts/form-field";
import { ApiError, apiClient } from "@/lib/api/client";
import { commonScales, drawingCreateSchema, drawingKindLabels, drawingKinds } from "@/lib/schemas/drawing";

type Input = z.input<typeof drawingCreateSchema>;
type Output = z.output<typeof drawingCreateSchema>;

/**
 * A drawing's entry in the register, checked in the browser by the schema the server uses. The number is
 * the server's, shown in the register once the drawing is recorded.
 */
export function DrawingForm({
  siteId,
  contexts,
  members,
}: {
  siteId: string;
  contexts: { id: string; number: number; trenchCode: string }[];
  members: { id: string; name: string }[];
}) {
  const router = useRouter();
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const { register, handleSubmit, setError, formState, reset } = useForm<Input, unknown, Output>({
    resolver: zodResolver(drawingCreateSchema),
    defaultValues: { kind: "plan", scale: 20, contextIds: [] },
  });
  const e = formState.errors;
  const submit = handleSubmit(async (values) => {
    setNote(null);
    try {
      const made = await apiClient.call("drawingsCreate", { siteId }, values);
      setNote({ ok: true, text: `Drawing ${made.number} recorded.` });
      reset();
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && applyFieldErrors(err.fieldErrors, setError as never)) return;
      setNote({ ok: false, text: err instanceof Error ? err.message : String(err) });
    }
  });
  return (
    <form onSubmit={submit} noValidate className="sheet space-y-3" aria-label="Record a drawing">
      <div className="grid gap-3 sm:grid-cols-3">
        <FormField id="drawing-kind" label="Kind" error={e.kind?.message}>
          <select id="drawing-kind" className="field" {...register("kind")}>
            {drawingKinds.map((k) => (
              <option key={k} value={k}>
                {drawingKindLabels[k]}
              </option>
            ))}
          </select>
        </FormField>
        <FormField
          id="drawing-scale"
          label="Scale 1:"
          error={e.scale?.message}
          hint={`Usually ${commonScales.join(", ")}.`}
        >
          <input id="drawing-scale" className="field num" inputMode="numeric" {...register("scale")} />
        </FormField>
        <FormField
          id="drawing-contexts"
          label="Contexts shown"
          error={e.contextIds?.message}
          hint="One trench; hold Ctrl or ⌘ to pick several."
        >
          <select id="drawing-contexts" className="field num" multiple size={5} {...register("contextIds")}>
            {contexts.map((c) => (
              <option key={c.id} value={c.id}>
                {c.number} (trench {c.trenchCode})
              </option>
            ))}
          </select>
        </FormField>
      </div>
      <FormField id="drawing-title" label="Title" error={e.title?.message}>
        <input
          id="drawing-title"
          className="field"
          placeholder="e.g. Section through ditch 1005, east face"
          {...register("title")}
        />
      </FormField>
      <div className="grid gap-3 sm:grid-cols-2">
        <FormField id="drawing-drawn-by" label="Drawn by" error={e.drawnBy?.message}>
          <select id="drawing-drawn-by" className="field" {...register("drawnBy")}>
            <option value="">Me</option>
            {members.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
        </FormField>
        <FormField id="drawing-drawn-on" label="Drawn on" error={e.drawnOn?.message} hint="Blank = today.">
          <input
            id="drawing-drawn-on"
            type="date"
            className="field num"
            {...register("drawnOn", { setValueAs: (v) => (v === "" ? undefined : v) })}
          />
        </FormField>
      </div>
      <p role="status" aria-live="polite" className={note?.ok ? "font-semibold text-ok" : "field-error"}>
        {note?.text ?? ""}
      </p>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
        Record the drawing
      </button>
    </form>
  );
}
