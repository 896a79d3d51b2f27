"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { ApiError, apiClient } from "@/lib/api/client";
import { DrawingForm, type DrawingEntry } from "./drawing-form";

/**
 * Edit and delete for one row of the drawing register. A drawing is locked with the contexts it shows: while
 * one of them is submitted or signed off the row says so instead of offering the buttons (the server refuses
 * the change either way). Deleting asks why; the number is never handed out again.
 */
export function DrawingActions({
  siteId,
  drawing,
  lockedBy,
  contexts,
  members,
}: {
  siteId: string;
  drawing: DrawingEntry;
  lockedBy: number[];
  contexts: { id: string; number: number; trenchCode: string }[];
  members: { id: string; name: string }[];
}) {
  const router = useRouter();
  const [open, setOpen] = useState<"edit" | "delete" | null>(null);
  const [reason, setReason] = useState("");
  const [failed, setFailed] = useState<ApiError | null>(null);
  if (lockedBy.length)
    return (
      <span className="text-sm text-ink-soft">
        Locked with context{lockedBy.length === 1 ? "" : "s"} {lockedBy.join(", ")}
      </span>
    );

  async function remove() {
    setFailed(null);
    try {
      await apiClient.call("drawingDelete", { siteId, drawingId: drawing.id }, { reason });
      setOpen(null);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError) setFailed(err);
      else throw err;
    }
  }

  return (
    <div className="space-y-2">
      <div className="flex gap-2">
        <button
          type="button"
          className="btn"
          aria-expanded={open === "edit"}
          onClick={() => setOpen(open === "edit" ? null : "edit")}
        >
          Edit<span className="sr-only"> drawing {drawing.number}</span>
        </button>
        <button
          type="button"
          className="btn"
          aria-expanded={open === "delete"}
          onClick={() => setOpen(open === "delete" ? null : "delete")}
        >
          Delete<span className="sr-only"> drawing {drawing.number}</span>
        </button>
      </div>
      {open === "edit" && (
        <DrawingForm
          siteId={siteId}
          contexts={contexts}
          members={members}
          drawing={drawing}
          onDone={() => setOpen(null)}
        />
      )}
      {open === "delete" && (
        <div className="sheet space-y-2">
          <label className="label" htmlFor={`drawing-${drawing.number}-reason`}>
            Why is drawing {drawing.number} deleted?
          </label>
          <input
            id={`drawing-${drawing.number}-reason`}
            className="field"
            value={reason}
            onChange={(e) => setReason(e.target.value)}
          />
          {failed && (
            <p role="alert" className="field-error">
              {failed.fieldErrors.reason?.join(" ") ?? failed.message}
            </p>
          )}
          <button type="button" className="btn-danger" onClick={remove}>
            Delete drawing {drawing.number}
          </button>
        </div>
      )}
    </div>
  );
}
