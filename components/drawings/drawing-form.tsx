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

/** A drawing already in the register, as its edit form starts. */
export type DrawingEntry = {
  id: string;
  number: number;
  kind: Input["kind"];
  scale: number;
  contextIds: string[];
  title: string;
  drawnBy: string | null;
  drawnOn: string;
};

/**
 * A drawing's entry in the register, checked in the browser by the schema the server uses. The number is
 * the server's, shown in the register once the drawing is recorded. Given `drawing`, the form changes that
 * entry instead (the server refuses it while a context it shows is submitted or signed off).
 */
export function DrawingForm({
  siteId,
  contexts,
  members,
  drawing,
  onDone,
}: {
  siteId: string;
  contexts: { id: string; number: number; trenchCode: string }[];
  members: { id: string; name: string }[];
  drawing?: DrawingEntry;
  onDone?: () => void;
}) {
  const router = useRouter();
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const { register, handleSubmit, setError, formState, reset } = useForm<Input, unknown, Output>({
    resolver: zodResolver(drawingCreateSchema),
    defaultValues: drawing
      ? {
          kind: drawing.kind,
          scale: drawing.scale,
          contextIds: drawing.contextIds,
          title: drawing.title,
          drawnBy: drawing.drawnBy ?? "",
          drawnOn: drawing.drawnOn,
        }
      : { kind: "plan", scale: 20, contextIds: [] },
  });
  const e = formState.errors;
  const p = drawing ? `drawing-${drawing.number}` : "drawing";
  const submit = handleSubmit(async (values) => {
    setNote(null);
    try {
      if (drawing) {
        await apiClient.call("drawingUpdate", { siteId, drawingId: drawing.id }, values);
        setNote({ ok: true, text: `Drawing ${drawing.number} changed.` });
        onDone?.();
        router.refresh();
        return;
      }
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
    <form
      onSubmit={submit}
      noValidate
      className="sheet space-y-3"
      aria-label={drawing ? `Change drawing ${drawing.number}` : "Record a drawing"}
    >
      <div className="grid gap-3 sm:grid-cols-3">
        <FormField id={`${p}-kind`} label="Kind" error={e.kind?.message}>
          <select id={`${p}-kind`} className="field" {...register("kind")}>
            {drawingKinds.map((k) => (
              <option key={k} value={k}>
                {drawingKindLabels[k]}
              </option>
            ))}
          </select>
        </FormField>
        <FormField
          id={`${p}-scale`}
          label="Scale 1:"
          error={e.scale?.message}
          hint={`Usually ${commonScales.join(", ")}.`}
        >
          <input id={`${p}-scale`} className="field num" inputMode="numeric" {...register("scale")} />
        </FormField>
        <FormField
          id={`${p}-contexts`}
          label="Contexts shown"
          error={e.contextIds?.message}
          hint="One trench; hold Ctrl or ⌘ to pick several."
        >
          <select id={`${p}-contexts`} className="field num" multiple size={5} {...register("contextIds")}>
            {contexts.map((c) => (
              <option key={c.id} value={c.id}>
                {c.number} (trench {c.trenchCode})
              </option>
            ))}
          </select>
        </FormField>
      </div>
      <FormField id={`${p}-title`} label="Title" error={e.title?.message}>
        <input
          id={`${p}-title`}
          className="field"
          placeholder="e.g. Section through ditch 1005, east face"
          {...register("title")}
        />
      </FormField>
      <div className="grid gap-3 sm:grid-cols-2">
        <FormField id={`${p}-drawn-by`} label="Drawn by" error={e.drawnBy?.message}>
          <select id={`${p}-drawn-by`} className="field" {...register("drawnBy")}>
            <option value="">{drawing ? "Not named" : "Me"}</option>
            {members.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
        </FormField>
        <FormField id={`${p}-drawn-on`} label="Drawn on" error={e.drawnOn?.message} hint="Blank = today.">
          <input
            id={`${p}-drawn-on`}
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
        {drawing ? "Save the drawing" : "Record the drawing"}
      </button>
    </form>
  );
}
