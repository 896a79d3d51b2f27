"use client";

import Link from "next/link";
import { useDates } from "@/components/locale";
import type { FindProcessing } from "@/lib/schemas/processing";

/** One register row as the API sends it (lib/server/finds.ts listFinds). */
export type RegisterRow = {
  id: string;
  number: number;
  stationPoint?: string | null;
  x: number;
  y: number;
  z: number | null;
  count: number | null;
  weightG: number | null;
  description: string;
  method: string;
  recordedAt: string;
  recordedBy: string | null;
  trenchId: string;
  trenchCode: string;
  contextId: string;
  contextNumber: number;
  contextState: string;
  classId: string;
  classCode: string;
  classLabel: string;
  classColour: string;
  classSymbol: string;
  processing?: FindProcessing;
  boxNumber?: number | null;
};

const lockWords: Record<string, string> = {
  signed_off: "its context is signed off",
  awaiting: "its context awaits sign-off",
};

/** The inline view of one find, with the ways on: its page (to edit), its context, the plan. */
export function FindPanel({ siteId, find: f, onClose }: { siteId: string; find: RegisterRow; onClose: () => void }) {
  const locked = lockWords[f.contextState];
  const { when } = useDates();
  return (
    <section className="sheet" aria-labelledby="find-panel-h">
      <div className="flex flex-wrap items-baseline gap-3">
        <h2 id="find-panel-h" className="text-xl font-bold">
          Find <span className="num">{f.number}</span>
        </h2>
        <span className="text-ink-soft">
          {f.classCode} · {f.classLabel}
        </span>
        <button type="button" className="btn ml-auto" onClick={onClose}>
          Close
        </button>
      </div>
      <dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-4">
        <dt className="text-ink-soft">Position (m)</dt>
        <dd className="num">
          {f.x.toFixed(3)}, {f.y.toFixed(3)}
          {f.z !== null ? `, ${f.z.toFixed(3)}` : ""}
        </dd>
        <dt className="text-ink-soft">Context</dt>
        <dd className="num">
          {f.contextNumber} (trench {f.trenchCode})
        </dd>
        <dt className="text-ink-soft">Count · weight</dt>
        <dd className="num">
          {f.count ?? "—"} · {f.weightG !== null ? `${f.weightG} g` : "—"}
        </dd>
        <dt className="text-ink-soft">Recorded</dt>
        <dd>
          {f.recordedBy ?? "—"}, <span className="num">{when(f.recordedAt)}</span> ({f.method})
        </dd>
        {f.stationPoint && (
          <>
            <dt className="text-ink-soft">Station point</dt>
            <dd className="num">{f.stationPoint}</dd>
          </>
        )}
      </dl>
      {f.description && <p className="mt-2 whitespace-pre-wrap">{f.description}</p>}
      {locked && <p className="mt-2 font-semibold text-ok">Cannot be edited: {locked}.</p>}
      <div className="mt-3 flex flex-wrap gap-2">
        <Link className="btn-primary" href={`/sites/${siteId}/finds/${f.id}`}>
          {locked ? "Open the find" : "Open and edit"}
        </Link>
        <Link className="btn" href={`/sites/${siteId}/trenches/${f.trenchId}?find=${f.id}`}>
          See it on the plan
        </Link>
        <Link className="btn" href={`/sites/${siteId}/contexts/${f.contextId}`}>
          Context {f.contextNumber}
        </Link>
      </div>
    </section>
  );
}
