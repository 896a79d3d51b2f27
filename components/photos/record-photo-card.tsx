"use client";

import { useState } from "react";
import { FormField } from "@/components/contexts/form-field";
import { ApiError, apiClient } from "@/lib/api/client";
import type { RecordPhotoRow } from "@/lib/api/archive-responses";
import { compassPoints, facingWords } from "@/lib/schemas/record-photo";
import { formatWhen } from "@/lib/words/when";

/** One photo of the register: its thumbnail (opening the display copy), its sheet, and its edit and delete. */
export function RecordPhotoCard({
  siteId,
  photo: p,
  canEdit,
  changed,
}: {
  siteId: string;
  photo: RecordPhotoRow;
  canEdit: boolean;
  changed: () => Promise<void>;
}) {
  const [mode, setMode] = useState<"view" | "edit" | "delete">("view");
  const [open, setOpen] = useState(false);
  const [error, setError] = useState<{ text: string; fields: Record<string, string> } | null>(null);
  const id = `photo-${p.number}`;
  const params = { siteId, photoId: p.id };

  const run = async (work: () => Promise<unknown>) => {
    setError(null);
    try {
      await work();
      setMode("view");
      await changed();
    } catch (err) {
      const fields =
        err instanceof ApiError
          ? Object.fromEntries(Object.entries(err.fieldErrors).map(([k, v]) => [k, v.join(" ")]))
          : {};
      setError({ text: err instanceof Error ? err.message : String(err), fields });
    }
  };

  const facingOptions = compassPoints.some(([, d]) => d === p.facing)
    ? compassPoints
    : p.facing === null
      ? compassPoints
      : [...compassPoints, [`${p.facing}°`, p.facing] as const];

  return (
    <li className="space-y-2 rounded border border-paper-edge p-2" data-photo={p.number}>
      <button
        type="button"
        className="block w-full"
        aria-label={`Open photo ${p.number}`}
        onClick={() => setOpen(true)}
      >
        {/* Member-only files streamed by the app; next/image would fetch them again through its optimiser. */}
        <img
          src={p.thumbUrl}
          alt={`Photo ${p.number}${p.caption ? `: ${p.caption}` : ""}`}
          className="h-40 w-full rounded bg-paper-deep object-contain"
          loading="lazy"
        />
      </button>
      {open && (
        <div
          role="dialog"
          aria-modal="true"
          aria-label={`Photo ${p.number}`}
          className="fixed inset-0 z-50 flex flex-col gap-2 bg-ink/90 p-2 sm:p-6"
          onKeyDown={(e) => e.key === "Escape" && setOpen(false)}
        >
          <p className="flex flex-wrap items-center gap-2 text-paper">
            <span className="num font-semibold">Photo {p.number}</span>
            <span className="grow">{p.caption}</span>
            <button type="button" className="btn" autoFocus onClick={() => setOpen(false)}>
              Close
            </button>
          </p>
          <img
            src={p.displayUrl}
            alt={`Photo ${p.number}, display copy`}
            className="min-h-0 w-full flex-1 object-contain"
          />
        </div>
      )}
      <p className="text-sm">
        <span className="num font-semibold">Photo {p.number}</span> · facing {facingWords(p.facing)} · scale{" "}
        {p.scale || "not stated"}
      </p>
      {p.caption && <p className="whitespace-pre-wrap text-sm">{p.caption}</p>}
      <p className="text-xs text-ink-soft">
        Taken by {p.takenBy ?? "—"}, <span className="num">{p.takenAt ? formatWhen(p.takenAt) : "date not known"}</span>{" "}
        ({p.takenAtSource === "camera" ? "camera date" : "upload date: the file had none"}) ·{" "}
        <a className="underline" href={p.originalUrl}>
          original
        </a>
      </p>
      {canEdit && mode === "view" && (
        <p className="flex flex-wrap gap-2">
          <button type="button" className="btn" onClick={() => setMode("edit")}>
            Edit photo {p.number}
          </button>
          <button type="button" className="btn" onClick={() => setMode("delete")}>
            Delete photo {p.number}
          </button>
        </p>
      )}
      {mode === "edit" && (
        <form
          className="space-y-2"
          aria-label={`Edit photo ${p.number}`}
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            const d = new FormData(e.currentTarget);
            void run(() =>
              apiClient.call("recordPhotoUpdate", params, {
                facing: String(d.get("facing") ?? ""),
                scale: String(d.get("scale") ?? ""),
                caption: String(d.get("caption") ?? ""),
              }),
            );
          }}
        >
          <FormField id={`${id}-facing`} label="Facing" error={error?.fields.facing}>
            <select id={`${id}-facing`} name="facing" className="field" defaultValue={p.facing ?? ""}>
              <option value="">Not stated</option>
              {facingOptions.map(([point, degrees]) => (
                <option key={point} value={degrees}>
                  {point} ({degrees}°)
                </option>
              ))}
            </select>
          </FormField>
          <FormField id={`${id}-scale`} label="Scale shown" error={error?.fields.scale}>
            <input id={`${id}-scale`} name="scale" className="field" defaultValue={p.scale} />
          </FormField>
          <FormField id={`${id}-caption`} label="Caption" error={error?.fields.caption}>
            <textarea id={`${id}-caption`} name="caption" rows={2} className="field" defaultValue={p.caption} />
          </FormField>
          <p className="flex gap-2">
            <button type="submit" className="btn-primary">
              Save photo {p.number}
            </button>
            <button type="button" className="btn" onClick={() => setMode("view")}>
              Cancel
            </button>
          </p>
        </form>
      )}
      {mode === "delete" && (
        <form
          className="space-y-2"
          aria-label={`Delete photo ${p.number}`}
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            const reason = String(new FormData(e.currentTarget).get("reason") ?? "");
            void run(() => apiClient.call("recordPhotoDelete", params, { reason }));
          }}
        >
          <FormField
            id={`${id}-reason`}
            label="Why delete it?"
            error={error?.fields.reason}
            hint="Kept in the audit trail; the number is not used again."
          >
            <input id={`${id}-reason`} name="reason" className="field" />
          </FormField>
          <p className="flex gap-2">
            <button type="submit" className="btn-danger">
              Delete photo {p.number}
            </button>
            <button type="button" className="btn" onClick={() => setMode("view")}>
              Keep it
            </button>
          </p>
        </form>
      )}
      {error && !Object.keys(error.fields).length && (
        <p role="alert" className="field-error">
          {error.text}
        </p>
      )}
    </li>
  );
}
