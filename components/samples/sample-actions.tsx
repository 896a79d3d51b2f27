"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiClient } from "@/lib/api/client";
import { sampleStatusLabels, sampleStatuses, type SampleStatus } from "@/lib/schemas/sample";

/**
 * Processing status of the samples picked (one on the sample's page, many in the register): post-excavation
 * care, allowed to every role and after sign-off.
 */
export function SampleStatusControl({
  siteId,
  sampleIds,
  current,
  onDone,
}: {
  siteId: string;
  sampleIds: string[];
  current?: SampleStatus;
  onDone?: () => void;
}) {
  const router = useRouter();
  const [status, setStatus] = useState<SampleStatus>(current ?? "processed");
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const apply = async () => {
    setBusy(true);
    setNote(null);
    try {
      const done = await apiClient.call("samplesStatus", { siteId }, { sampleIds, status });
      setNote({
        ok: true,
        text: `${done.changed} ${done.changed === 1 ? "sample" : "samples"} now “${sampleStatusLabels[status]}”.`,
      });
      onDone?.();
      router.refresh();
    } catch (err) {
      setNote({ ok: false, text: err instanceof Error ? err.message : String(err) });
    } finally {
      setBusy(false);
    }
  };
  return (
    <div className="flex flex-wrap items-end gap-2">
      <div>
        <label className="label" htmlFor="sample-status">
          Processing status
        </label>
        <select
          id="sample-status"
          className="field"
          value={status}
          onChange={(e) => setStatus(e.target.value as SampleStatus)}
        >
          {sampleStatuses.map((s) => (
            <option key={s} value={s}>
              {sampleStatusLabels[s]}
            </option>
          ))}
        </select>
      </div>
      <button type="button" className="btn" disabled={busy || sampleIds.length === 0} onClick={apply}>
        Set for {sampleIds.length} {sampleIds.length === 1 ? "sample" : "samples"}
      </button>
      <p role="status" aria-live="polite" className={note?.ok ? "font-semibold text-ok" : "field-error"}>
        {note?.text ?? ""}
      </p>
    </div>
  );
}

/** Deleting a sample asks why; the number is never handed out again and the trail keeps the reason. */
export function SampleDelete({ siteId, sampleId, number }: { siteId: string; sampleId: string; number: number }) {
  const router = useRouter();
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const remove = async () => {
    setError(null);
    try {
      await apiClient.call("sampleDelete", { siteId, sampleId }, { reason });
      router.push(`/sites/${siteId}/samples`);
    } catch (err) {
      setError(err instanceof Error ? err.message : String(err));
    }
  };
  return (
    <details className="sheet">
      <summary className="cursor-pointer font-semibold">Delete sample {number}</summary>
      <label className="label mt-2" htmlFor="sample-delete-reason">
        Why is it deleted?
      </label>
      <input id="sample-delete-reason" className="field" value={reason} onChange={(e) => setReason(e.target.value)} />
      <p className="field-error" aria-live="polite">
        {error ?? ""}
      </p>
      <button type="button" className="btn" onClick={remove}>
        Delete, with this reason
      </button>
    </details>
  );
}

/**
 * Where the samples picked are kept: a box of the box register (or none) and a place in the store. After the
 * trench, so not locked with the context; a sample with a specialist or discarded goes in no box.
 */
export function SampleBoxControl({
  siteId,
  sampleIds,
  boxes,
  current,
  onDone,
}: {
  siteId: string;
  sampleIds: string[];
  boxes: { id: string; number: number; store: string }[];
  current?: string | null;
  onDone?: () => void;
}) {
  const router = useRouter();
  const [box, setBox] = useState(current ?? "none");
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const apply = async () => {
    setNote(null);
    try {
      const done = await sendStore(siteId, sampleIds, box === "none" ? null : box);
      setNote({
        ok: true,
        text: done.pending
          ? "No connection: the change waits on this device."
          : `${done.changed} ${done.changed === 1 ? "sample" : "samples"} ${done.boxNumber ? `now in box ${done.boxNumber}` : "in no box"}.`,
      });
      onDone?.();
      router.refresh();
    } catch (err) {
      setNote({ ok: false, text: err instanceof Error ? err.message : String(err) });
    }
  };
  return (
    <div className="flex flex-wrap items-end gap-2">
      <div>
        <label className="label" htmlFor="sample-box">
          Box
        </label>
        <select id="sample-box" className="field num" value={box} onChange={(e) => setBox(e.target.value)}>
          <option value="none">In no box</option>
          {boxes.map((b) => (
            <option key={b.id} value={b.id}>
              Box {b.number}
              {b.store ? ` · ${b.store}` : ""}
            </option>
          ))}
        </select>
      </div>
      <button type="button" className="btn" disabled={sampleIds.length === 0} onClick={apply}>
        Store {sampleIds.length} {sampleIds.length === 1 ? "sample" : "samples"}
      </button>
      <p role="status" aria-live="polite" className={note?.ok ? "font-semibold text-ok" : "field-error"}>
        {note?.text ?? ""}
      </p>
    </div>
  );
}

async function sendStore(siteId: string, sampleIds: string[], boxId: string | null) {
  return (await apiClient.call("samplesStore", { siteId }, { sampleIds, boxId })) as {
    changed: number;
    boxNumber: number | null;
    pending?: boolean;
  };
}
