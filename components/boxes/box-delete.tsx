"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ApiError, apiClient, keptOnDevice } from "@/lib/api/client";
import { countOf } from "@/lib/words/count";

/**
 * Deleting a box made by mistake. Only an empty box goes: one still holding finds or samples says how many
 * and where to move them from (the server refuses it too, so a box filled meanwhile is never lost). Sent
 * through the device's write path, so with no connection the deletion waits in the outbox.
 */
export function BoxDelete({
  siteId,
  box,
  holds,
}: {
  siteId: string;
  box: { id: string; number: number };
  holds: { finds: number; samples: number };
}) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [said, setSaid] = useState<string | null>(null);
  const [failed, setFailed] = useState<string | null>(null);
  const empty = holds.finds === 0 && holds.samples === 0;
  const what = [holds.finds && countOf(holds.finds, "find"), holds.samples && countOf(holds.samples, "sample")]
    .filter(Boolean)
    .join(" and ");

  async function remove() {
    setBusy(true);
    setFailed(null);
    try {
      const answer = await apiClient.call("boxDelete", { siteId, boxId: box.id });
      if (keptOnDevice(answer)) setSaid(`No connection: box ${box.number} is deleted when the connection is back.`);
      else router.push(`/sites/${siteId}/boxes`);
    } catch (err) {
      if (err instanceof ApiError) setFailed(err.message);
      else throw err;
    } finally {
      setBusy(false);
    }
  }

  return (
    <details className="sheet">
      <summary className="cursor-pointer font-semibold">Delete box {box.number}</summary>
      {empty ? (
        <p className="mt-2">The box is empty. Deleting it removes it from the register; its number is free again.</p>
      ) : (
        <p className="mt-2">
          Box {box.number} still holds {what}; only an empty box can be deleted. Move them to another box first: finds
          with “Processing and box” in the{" "}
          <Link className="underline" href={`/sites/${siteId}/finds`}>
            finds register
          </Link>
          , samples in the{" "}
          <Link className="underline" href={`/sites/${siteId}/samples`}>
            samples register
          </Link>
          .
        </p>
      )}
      <p role="alert" className="field-error">
        {failed ?? ""}
      </p>
      <button type="button" className="btn mt-2" disabled={busy || !empty || said !== null} onClick={remove}>
        {busy ? "Deleting…" : `Delete box ${box.number}`}
      </button>
      <p aria-live="polite">{said}</p>
    </details>
  );
}
