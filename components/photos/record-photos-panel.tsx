"use client";

import { useCallback, useEffect, useState } from "react";
import { FormField } from "@/components/contexts/form-field";
import { ApiError, apiClient } from "@/lib/api/client";
import type { RecordPhotoRow } from "@/lib/api/archive-responses";
import { commonPhotoScales, compassPoints, type PhotoSubject } from "@/lib/schemas/record-photo";
import { RecordPhotoCard } from "./record-photo-card";

/** Mirrors the server's limits so a refusal can be explained before anything is sent. */
const TYPES = ["image/jpeg", "image/png", "image/webp", "image/tiff", "image/heic", "image/heif", "image/avif"];
const MAX = 16 * 1024 * 1024;

const filterOf = (subject: PhotoSubject, id: string): Record<string, string> =>
  subject === "context" ? { contextId: id } : subject === "find" ? { findId: id } : { trenchId: id };

/**
 * The photos of one context, find or trench: thumbnails that open the photo, and (while the record is open)
 * a form to add one with its facing, scale, caption and photographer, and each photo's edit and delete.
 */
export function RecordPhotosPanel({
  siteId,
  subject,
  subjectId,
  what,
  canEdit,
  members,
}: {
  siteId: string;
  subject: PhotoSubject;
  subjectId: string;
  /** "context 1003", "find 4242", "trench A": how the panel names the record. */
  what: string;
  canEdit: boolean;
  members: { id: string; name: string }[];
}) {
  const [rows, setRows] = useState<RecordPhotoRow[] | null>(null);
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const prefix = `photo-${subject}`;

  const load = useCallback(async () => {
    try {
      const page = await apiClient.call(
        "recordPhotosList",
        { siteId },
        { ...filterOf(subject, subjectId), pageSize: 500 },
      );
      // A trench's panel shows the photos of the trench itself; those of its contexts and finds are on their sheets.
      setRows(subject === "trench" ? page.rows.filter((r) => r.subject === "trench") : page.rows);
    } catch (err) {
      setNote({ ok: false, text: err instanceof Error ? err.message : String(err) });
    }
  }, [siteId, subject, subjectId]);

  useEffect(() => {
    void load();
  }, [load]);

  const add = async (form: HTMLFormElement) => {
    const data = new FormData(form);
    const file = data.get("file");
    setNote(null);
    setFieldErrors({});
    if (!(file instanceof File) || file.size === 0) return setFieldErrors({ file: "Choose or take a photo." });
    if (!TYPES.includes(file.type))
      return setFieldErrors({
        file: `“${file.name}” is ${file.type || "of no known type"}, not a photo: choose a JPEG, PNG, WebP, TIFF, HEIF or AVIF image.`,
      });
    if (file.size > MAX)
      return setFieldErrors({ file: `“${file.name}” is ${(file.size / 1048576).toFixed(1)} MB; the limit is 16 MB.` });
    setBusy(true);
    try {
      const made = await apiClient.upload("recordPhoto", file, {
        siteId,
        subject,
        subjectId,
        facing: String(data.get("facing") ?? ""),
        scale: String(data.get("scale") ?? ""),
        caption: String(data.get("caption") ?? ""),
        takenBy: String(data.get("takenBy") ?? ""),
      });
      setNote({
        ok: true,
        text: made.pending
          ? `“${file.name}” is kept on this device and will be uploaded when the connection returns; its number comes then.`
          : `Photo ${made.number} added to ${what}.`,
      });
      form.reset();
      await load();
    } catch (err) {
      if (err instanceof ApiError && err.hasFieldErrors)
        setFieldErrors(Object.fromEntries(Object.entries(err.fieldErrors).map(([k, v]) => [k, v.join(" ")])));
      setNote({ ok: false, text: err instanceof Error ? err.message : String(err) });
    } finally {
      setBusy(false);
    }
  };

  return (
    <section aria-labelledby={`${prefix}-h`} className="sheet space-y-3">
      <h2 id={`${prefix}-h`} className="text-lg font-bold">
        Photos of {what}
      </h2>
      {rows === null ? (
        <p className="text-ink-soft">Reading the photos…</p>
      ) : rows.length === 0 ? (
        <p className="text-ink-soft">No photos of {what} yet.</p>
      ) : (
        <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3" aria-label={`Photos of ${what}`}>
          {rows.map((p) => (
            <RecordPhotoCard key={p.id} siteId={siteId} photo={p} canEdit={canEdit && !p.locked} changed={load} />
          ))}
        </ul>
      )}
      {canEdit && (
        <form
          className="space-y-3 border-t border-paper-edge pt-3"
          aria-label={`Add a photo of ${what}`}
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            void add(e.currentTarget);
          }}
        >
          <h3 className="font-bold">Add a photo</h3>
          <FormField
            id={`${prefix}-file`}
            label="Photo"
            error={fieldErrors.file}
            hint="JPEG, PNG, WebP, TIFF, HEIF; up to 16 MB."
          >
            <input
              id={`${prefix}-file`}
              name="file"
              type="file"
              accept="image/*"
              capture="environment"
              className="field"
              data-testid="record-photo-input"
            />
          </FormField>
          <div className="grid gap-3 sm:grid-cols-3">
            <FormField
              id={`${prefix}-facing`}
              label="Facing"
              error={fieldErrors.facing}
              hint="Which way the camera looked."
            >
              <select id={`${prefix}-facing`} name="facing" className="field" defaultValue="">
                <option value="">Not stated</option>
                {compassPoints.map(([point, degrees]) => (
                  <option key={point} value={point}>
                    {point} ({degrees}°)
                  </option>
                ))}
              </select>
            </FormField>
            <FormField id={`${prefix}-scale`} label="Scale shown" error={fieldErrors.scale} hint="e.g. 1 m, 2 m, none.">
              <input
                id={`${prefix}-scale`}
                name="scale"
                className="field"
                list={`${prefix}-scales`}
                defaultValue="1 m"
                autoComplete="off"
              />
              <datalist id={`${prefix}-scales`}>
                {commonPhotoScales.map((s) => (
                  <option key={s} value={s} />
                ))}
              </datalist>
            </FormField>
            <FormField id={`${prefix}-taken-by`} label="Taken by" error={fieldErrors.takenBy}>
              <select id={`${prefix}-taken-by`} name="takenBy" className="field" defaultValue="">
                <option value="">Me</option>
                {members.map((m) => (
                  <option key={m.id} value={m.id}>
                    {m.name}
                  </option>
                ))}
              </select>
            </FormField>
          </div>
          <FormField id={`${prefix}-caption`} label="Caption" error={fieldErrors.caption}>
            <textarea
              id={`${prefix}-caption`}
              name="caption"
              rows={2}
              className="field"
              placeholder="e.g. Hearth 1003 half-sectioned, from the south"
            />
          </FormField>
          <p className="text-xs text-ink-faint">
            The date comes from the camera when the file carries it, else from the upload; the number from the server.
          </p>
          <button type="submit" className="btn-primary" disabled={busy}>
            {busy ? "Uploading…" : "Add the photo"}
          </button>
        </form>
      )}
      <p role="status" aria-live="polite" className={note?.ok ? "font-semibold text-ok" : "field-error"}>
        {note?.text ?? ""}
      </p>
    </section>
  );
}
