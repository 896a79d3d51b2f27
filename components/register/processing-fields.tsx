"use client";

import { findProcessingLabels, findProcessingStates, type FindProcessing } from "@/lib/schemas/processing";

export type BoxChoice = { id: string; number: number; store: string };

/** What the after-the-trench form holds; "" = leave as it is ("none" takes the finds out of their box). */
export type ProcessingDraft = { processing: FindProcessing | ""; sentTo: string; box: string; location: string };
export const emptyDraft: ProcessingDraft = { processing: "", sentTo: "", box: "", location: "" };

/** The body of a `process` change from the form: only what was set. */
export function processingBody(d: ProcessingDraft) {
  return {
    ...(d.processing && { processing: d.processing }),
    ...(d.processing === "sent" && { sentTo: d.sentTo }),
    ...(d.box && { boxId: d.box === "none" ? null : d.box }),
    ...(d.location.trim() && { location: d.location.trim() }),
  };
}

/**
 * The after-the-trench fields: state (washed … with a specialist, back), who it went to, the box and where
 * it is kept. Shared by the register's bulk bar and the find page.
 */
export function ProcessingFields({
  idPrefix,
  draft,
  boxes,
  onChange,
  keepWords = "Leave as it is",
}: {
  idPrefix: string;
  draft: ProcessingDraft;
  boxes: BoxChoice[];
  onChange: (d: ProcessingDraft) => void;
  keepWords?: string;
}) {
  const set = (part: Partial<ProcessingDraft>) => onChange({ ...draft, ...part });
  return (
    <div className="grid gap-3 sm:grid-cols-4">
      <div>
        <label className="label" htmlFor={`${idPrefix}-state`}>
          Processing
        </label>
        <select
          id={`${idPrefix}-state`}
          className="field"
          value={draft.processing}
          onChange={(e) => set({ processing: e.target.value as FindProcessing | "" })}
        >
          <option value="">{keepWords}</option>
          {findProcessingStates.map((s) => (
            <option key={s} value={s}>
              {findProcessingLabels[s]}
            </option>
          ))}
        </select>
      </div>
      {draft.processing === "sent" && (
        <div>
          <label className="label" htmlFor={`${idPrefix}-sent`}>
            Sent to
          </label>
          <input
            id={`${idPrefix}-sent`}
            className="field"
            value={draft.sentTo}
            placeholder="Specialist or laboratory"
            onChange={(e) => set({ sentTo: e.target.value })}
          />
        </div>
      )}
      <div>
        <label className="label" htmlFor={`${idPrefix}-box`}>
          Box
        </label>
        <select
          id={`${idPrefix}-box`}
          className="field num"
          value={draft.box}
          onChange={(e) => set({ box: e.target.value })}
        >
          <option value="">{keepWords}</option>
          <option value="none">In no box</option>
          {boxes.map((b) => (
            <option key={b.id} value={b.id}>
              Box {b.number}
              {b.store ? ` · ${b.store}` : ""}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor={`${idPrefix}-location`}>
          Kept at (when not in a box)
        </label>
        <input
          id={`${idPrefix}-location`}
          className="field"
          value={draft.location}
          placeholder={keepWords}
          onChange={(e) => set({ location: e.target.value })}
        />
      </div>
    </div>
  );
}
