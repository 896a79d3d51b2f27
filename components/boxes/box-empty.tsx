"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { ApiError, apiClient, keptOnDevice } from "@/lib/api/client";
import { countOf } from "@/lib/words/count";

type BoxChoice = { id: string; number: number; store: string };

/**
 * Emptying a box into another: everything in it (finds and samples) moves to the box picked, in one go, after a
 * confirmation that says how many finds move. Through the device's write path, so with no connection the move
 * waits in the outbox and the server moves what the box holds when it arrives.
 */
export function BoxEmpty({
  siteId,
  box,
  holds,
  others,
}: {
  siteId: string;
  box: { id: string; number: number };
  holds: { finds: number; samples: number };
  others: BoxChoice[];
}) {
  const router = useRouter();
  const id = useId();
  const [intoBoxId, setIntoBoxId] = useState("");
  const [confirming, setConfirming] = useState(false);
  const [busy, setBusy] = useState(false);
  const [said, setSaid] = useState<string | null>(null);
  const [failed, setFailed] = useState<ApiError | null>(null);
  const into = others.find((b) => b.id === intoBoxId);
  const what = [holds.finds && countOf(holds.finds, "find"), holds.samples && countOf(holds.samples, "sample")]
    .filter(Boolean)
    .join(" and ");

  async function move() {
    if (!into) return;
    setBusy(true);
    setFailed(null);
    try {
      const answer = await apiClient.call("boxEmpty", { siteId, boxId: box.id }, { intoBoxId: into.id });
      setConfirming(false);
      if (keptOnDevice(answer)) {
        setSaid(
          `No connection: box ${box.number} is emptied into box ${into.number} when the connection is back (what it holds then moves).`,
        );
        return;
      }
      const moved = [
        answer.findNumbers.length && countOf(answer.findNumbers.length, "find"),
        answer.sampleNumbers.length && countOf(answer.sampleNumbers.length, "sample"),
      ]
        .filter(Boolean)
        .join(" and ");
      setSaid(`Moved ${moved} into box ${into.number}.`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError) setFailed(err);
      else throw err;
    } finally {
      setBusy(false);
    }
  }

  if (!holds.finds && !holds.samples) return null;
  return (
    <details className="sheet">
      <summary className="cursor-pointer font-semibold">Empty box {box.number} into another</summary>
      {others.length === 0 ? (
        <p className="mt-2 text-ink-soft">The site has no other box yet: add one in the box register first.</p>
      ) : (
        <div className="mt-2 space-y-2">
          <div>
            <label className="label" htmlFor={`${id}-into`}>
              Box to move everything into
            </label>
            <select
              id={`${id}-into`}
              className="field"
              value={intoBoxId}
              onChange={(e) => {
                setIntoBoxId(e.target.value);
                setConfirming(false);
                setSaid(null);
              }}
            >
              <option value="">Pick a box…</option>
              {others.map((b) => (
                <option key={b.id} value={b.id}>
                  Box {b.number}
                  {b.store ? ` · ${b.store}` : ""}
                </option>
              ))}
            </select>
            {failed?.fieldErrors.intoBoxId?.length ? (
              <p className="field-error" aria-live="polite">
                {failed.fieldErrors.intoBoxId.join(" ")}
              </p>
            ) : null}
          </div>
          {!confirming && (
            <button type="button" className="btn" disabled={!into || busy} onClick={() => setConfirming(true)}>
              Empty box {box.number}…
            </button>
          )}
          {confirming && into && (
            <div
              role="alertdialog"
              aria-labelledby={`${id}-ask`}
              className="space-y-2 rounded border-2 border-accent p-3"
            >
              <p id={`${id}-ask`}>
                Move {what} from box {box.number} into box {into.number}? Each one&apos;s record says it moved, and box{" "}
                {box.number} is left empty.
              </p>
              <div className="flex gap-2">
                <button type="button" className="btn-primary" disabled={busy} onClick={move} autoFocus>
                  {busy ? "Moving…" : `Move ${what} into box ${into.number}`}
                </button>
                <button type="button" className="btn" onClick={() => setConfirming(false)}>
                  Cancel
                </button>
              </div>
            </div>
          )}
        </div>
      )}
      <p role="alert" className="field-error">
        {failed && !failed.fieldErrors.intoBoxId?.length ? failed.message : ""}
      </p>
      <p aria-live="polite">{said}</p>
    </details>
  );
}
