"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ApiError, apiClient, keptOnDevice } from "@/lib/api/client";
import { findProcessingLabels, type FindProcessing } from "@/lib/schemas/processing";
import { ProcessingFields, emptyDraft, processingBody, type BoxChoice } from "./processing-fields";

/**
 * A find after the trench: its processing and where it is, and the form to change them (the same change the
 * register makes for many finds, here for one). Not locked with the context: finds are washed and boxed
 * after their context is signed off.
 */
export function FindProcessingPanel({
  siteId,
  findId,
  now,
  boxes,
}: {
  siteId: string;
  findId: string;
  now: { processing: FindProcessing; sentTo: string; boxId: string | null; location: string };
  boxes: BoxChoice[];
}) {
  const router = useRouter();
  const [draft, setDraft] = useState(emptyDraft);
  const [said, setSaid] = useState<string | null>(null);
  const [failed, setFailed] = useState<ApiError | null>(null);
  const box = boxes.find((b) => b.id === now.boxId);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setSaid(null);
    setFailed(null);
    try {
      const answer = await apiClient.call(
        "findsBulk",
        { siteId },
        { action: "process", findIds: [findId], ...processingBody(draft) },
      );
      setSaid(keptOnDevice(answer) ? "No connection: the change waits on this device." : "Saved.");
      setDraft(emptyDraft);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError) setFailed(err);
      else throw err;
    }
  }

  return (
    <section className="sheet space-y-3" aria-labelledby="after-trench">
      <h2 id="after-trench" className="text-xl font-semibold">
        After the trench
      </h2>
      <dl className="grid grid-cols-[10rem_1fr] gap-y-1">
        <dt className="text-ink-soft">Processing</dt>
        <dd>
          {findProcessingLabels[now.processing]}
          {now.processing === "sent" && now.sentTo ? ` (${now.sentTo})` : ""}
        </dd>
        <dt className="text-ink-soft">Box</dt>
        <dd>
          {box ? (
            <Link className="underline" href={`/sites/${siteId}/boxes/${box.id}`}>
              Box {box.number}
              {box.store ? ` · ${box.store}` : ""}
            </Link>
          ) : (
            "in no box"
          )}
        </dd>
        <dt className="text-ink-soft">Kept at</dt>
        <dd>{now.location || "—"}</dd>
      </dl>
      <form onSubmit={save} className="space-y-2" aria-label="Change processing and box">
        <ProcessingFields idPrefix="fp" draft={draft} boxes={boxes} onChange={setDraft} />
        {failed && (
          <p role="alert" className="field-error">
            {failed.message} {Object.values(failed.fieldErrors).flat().join(" ")}
          </p>
        )}
        <button type="submit" className="btn">
          Save processing
        </button>
        <p aria-live="polite">{said}</p>
      </form>
    </section>
  );
}
