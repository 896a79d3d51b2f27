"use client";

import { stateWords } from "@/components/contexts/state-badge";
import type { ContextRow } from "./rows";

/**
 * Why a context's extent cannot change now, or null when it is open. Worded as the server's refusal
 * (assertContextWritable): an awaiting context waits for a director to sign it off or return it to open;
 * a signed-off one stays frozen until a director reopens it.
 */
export function extentLockedMessage(ctx: Pick<ContextRow, "number" | "state">): string | null {
  if (ctx.state === "open") return null;
  if (ctx.state === "awaiting") {
    return `Context ${ctx.number} is ${stateWords.awaiting.text}: its extent cannot change while it awaits sign-off. A director can sign it off or return it to open with a reason.`;
  }
  return `Context ${ctx.number} is ${stateWords[ctx.state]?.text ?? ctx.state}: its extent cannot change until a director reopens it with a reason.`;
}

/** A context's extent on the plan: pick the context, tap the corners of its extent, close to save; or clear it. */
export function ExtentPanel({
  contexts,
  contextId,
  hasExtent,
  count,
  saving,
  error,
  canEdit,
  onContext,
  onClose,
  onCancel,
  onClear,
}: {
  contexts: ContextRow[];
  contextId: string;
  hasExtent: boolean;
  /** Corners tapped so far. */
  count: number;
  saving: boolean;
  error: string | null;
  canEdit: boolean;
  onContext: (id: string) => void;
  onClose: () => void;
  onCancel: () => void;
  onClear: () => void;
}) {
  const ctx = contexts.find((c) => c.id === contextId);
  if (!contexts.length)
    return (
      <p className="text-ink-soft">
        This trench has no contexts yet: open a context sheet first, then draw its extent here.
      </p>
    );
  const locked = ctx ? extentLockedMessage(ctx) : null;
  return (
    <div className="space-y-4">
      <div>
        <label className="label" htmlFor="extent-context">
          Context
        </label>
        <select id="extent-context" className="field" value={contextId} onChange={(e) => onContext(e.target.value)}>
          {contexts.map((c) => (
            <option key={c.id} value={c.id}>
              {c.number} · {c.type}
              {c.extent ? " · has an extent" : ""}
              {c.state !== "open" ? ` · ${stateWords[c.state]?.text ?? c.state}` : ""}
            </option>
          ))}
        </select>
      </div>
      {locked && (
        <p className="field-error" role="note">
          {locked}
        </p>
      )}
      {!canEdit && <p className="text-ink-soft">Your role on this site reads the plan but does not draw extents.</p>}
      {canEdit && !locked && ctx && (
        <div className="rounded border-2 border-accent bg-accent-light p-3" data-testid="extent-drawing">
          <p className="font-semibold">
            Extent of context {ctx.number}: {count} corner{count === 1 ? "" : "s"}
          </p>
          <p className="text-sm">
            Choose Draw extent (E), tap each corner of the deposit on the plan, then tap the first corner, press Enter
            or Close and save.{hasExtent ? " Saving replaces the extent it has." : ""}
          </p>
        </div>
      )}
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="btn btn-primary"
          disabled={!canEdit || Boolean(locked) || count < 3 || saving}
          onClick={onClose}
        >
          {saving ? "Saving…" : "Close and save"}
        </button>
        <button type="button" className="btn" disabled={count === 0} onClick={onCancel}>
          Drop the corners
        </button>
        <button
          type="button"
          className="btn btn-danger"
          disabled={!canEdit || Boolean(locked) || !hasExtent || saving}
          onClick={onClear}
        >
          Clear the extent
        </button>
      </div>
      {error && (
        <p className="field-error" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}
