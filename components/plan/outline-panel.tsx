"use client";

import { useState } from "react";
import { parseOutlineText, type Rings } from "@/lib/geometry/outline-edit";
import type { OutlineCheck } from "@/lib/geometry/outline";

/** Live measures of the outline being edited, its refusal reason, saving, and pasted coordinates. */
export function OutlinePanel({
  rings,
  check,
  dirty,
  saving,
  locked,
  serverError,
  selectedVertex,
  drawing,
  onSave,
  onDiscard,
  onDeleteVertex,
  onImport,
  onCloseRing,
  onCancelRing,
}: {
  rings: Rings;
  check: OutlineCheck | null;
  dirty: boolean;
  saving: boolean;
  /** Why the outline cannot be saved (the trench is signed off), or null. */
  locked: string | null;
  serverError: string | null;
  selectedVertex: boolean;
  drawing: { kind: "draw" | "hole"; count: number } | null;
  onSave: () => void;
  onDiscard: () => void;
  onDeleteVertex: () => void;
  onImport: (rings: Rings) => void;
  onCloseRing: () => void;
  onCancelRing: () => void;
}) {
  const [text, setText] = useState("");
  const [importError, setImportError] = useState<string | null>(null);
  const apply = (t: string) => {
    try {
      onImport(parseOutlineText(t));
      setImportError(null);
    } catch (err) {
      setImportError((err as Error).message);
    }
  };
  return (
    <div className="space-y-4">
      {drawing && (
        <div className="rounded border-2 border-accent bg-accent-light p-3">
          <p className="font-semibold">
            {drawing.kind === "draw" ? "Drawing the trench edge" : "Drawing a hole"}: {drawing.count} corner
            {drawing.count === 1 ? "" : "s"}
          </p>
          <p className="text-sm">Tap each corner on the plan; tap the first corner or press Close to finish.</p>
          <div className="mt-2 flex gap-2">
            <button type="button" className="btn-primary" onClick={onCloseRing} disabled={drawing.count < 3}>
              Close ring
            </button>
            <button type="button" className="btn" onClick={onCancelRing}>
              Cancel
            </button>
          </div>
        </div>
      )}
      <dl className="grid grid-cols-2 gap-x-4 gap-y-1" aria-live="polite">
        <dt className="text-ink-soft">Area</dt>
        <dd className="num font-bold" data-testid="outline-area">
          {check?.ok ? `${check.window.area.toFixed(2)} m²` : "—"}
        </dd>
        <dt className="text-ink-soft">Perimeter</dt>
        <dd className="num font-bold" data-testid="outline-perimeter">
          {check?.ok ? `${check.window.perimeter.toFixed(2)} m` : "—"}
        </dd>
        <dt className="text-ink-soft">Corners</dt>
        <dd className="num">{rings[0]?.length ?? 0}</dd>
        <dt className="text-ink-soft">Holes</dt>
        <dd className="num" data-testid="outline-holes">
          {Math.max(0, rings.length - 1)}
        </dd>
      </dl>
      {check && !check.ok && (
        <p
          role="alert"
          className="rounded border-2 border-warn bg-warn-light p-2 font-semibold text-warn"
          data-testid="outline-problem"
        >
          Not a valid outline: {check.reason} The fault is marked on the plan.
        </p>
      )}
      {locked && (
        <p role="status" className="rounded border-2 border-ink/40 bg-paper-deep p-2 font-semibold">
          {locked}
        </p>
      )}
      {serverError && (
        <p role="alert" className="rounded border-2 border-warn bg-warn-light p-2 font-semibold text-warn">
          {serverError}
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="btn-primary"
          onClick={onSave}
          disabled={!dirty || saving || !check?.ok || Boolean(locked)}
        >
          {saving ? "Saving…" : "Save outline"}
        </button>
        <button type="button" className="btn" onClick={onDiscard} disabled={!dirty}>
          Discard changes
        </button>
        <button type="button" className="btn-danger" onClick={onDeleteVertex} disabled={!selectedVertex}>
          Delete vertex
        </button>
      </div>
      <details className="rounded border border-paper-edge p-2">
        <summary className="flex min-h-11 cursor-pointer items-center font-semibold">
          Paste or import coordinates
        </summary>
        <p className="my-2 text-sm text-ink-soft">
          CSV of x,y in site-grid metres, one corner a line; a blank line starts a hole (or a third column: 0 edge, 1,
          2… holes). GeoJSON Polygon or Feature also works.
        </p>
        <label className="label" htmlFor="outline-text">
          Coordinates
        </label>
        <textarea
          id="outline-text"
          className="field num"
          rows={6}
          value={text}
          onChange={(e) => setText(e.target.value)}
        />
        <div className="mt-2 flex flex-wrap gap-2">
          <button type="button" className="btn" onClick={() => apply(text)}>
            Use these coordinates
          </button>
          <label className="btn cursor-pointer">
            Import file…
            <input
              type="file"
              accept=".csv,.txt,.json,.geojson,text/csv,application/json,application/geo+json"
              className="sr-only"
              onChange={async (e) => {
                const file = e.target.files?.[0];
                if (file) {
                  const t = await file.text();
                  setText(t);
                  apply(t);
                }
                e.target.value = "";
              }}
            />
          </label>
        </div>
        {importError && (
          <p className="field-error" role="alert">
            {importError}
          </p>
        )}
      </details>
    </div>
  );
}
