"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiClient } from "@/lib/api/client";

/** How samples are numbered, and the address printed in front of label codes. The director sets both. */
export function RecordsForm({
  siteId,
  initial,
  canEdit,
  sampleCount,
}: {
  siteId: string;
  initial: { samplesShareFindNumbers: boolean; labelAddress: string };
  canEdit: boolean;
  sampleCount: number;
}) {
  const router = useRouter();
  const [shared, setShared] = useState(initial.samplesShareFindNumbers);
  const [address, setAddress] = useState(initial.labelAddress);
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});
  const save = async (ev: React.FormEvent) => {
    ev.preventDefault();
    setNote(null);
    setFieldErrors({});
    try {
      await apiClient.call("siteUpdate", { siteId }, { samplesShareFindNumbers: shared, labelAddress: address });
      setNote({ ok: true, text: "Saved." });
      router.refresh();
    } catch (err) {
      const fe = (err as { fieldErrors?: Record<string, string[]> }).fieldErrors ?? {};
      setFieldErrors(fe);
      setNote({ ok: false, text: err instanceof Error ? err.message : String(err) });
    }
  };
  return (
    <form className="sheet space-y-3" onSubmit={save} noValidate aria-label="Numbers and labels">
      <fieldset disabled={!canEdit || sampleCount > 0}>
        <legend className="label">Sample numbers</legend>
        <label className="flex min-h-11 items-center gap-2">
          <input
            type="radio"
            name="sample-numbers"
            className="size-5"
            checked={!shared}
            onChange={() => setShared(false)}
          />{" "}
          Their own sequence (sample 1, 2, 3 … beside find 1, 2, 3 …)
        </label>
        <label className="flex min-h-11 items-center gap-2">
          <input
            type="radio"
            name="sample-numbers"
            className="size-5"
            checked={shared}
            onChange={() => setShared(true)}
          />{" "}
          The finds&apos; sequence (each number is a find or a sample)
        </label>
        {sampleCount > 0 && (
          <p className="text-sm text-ink-soft">
            Fixed: this site already has {sampleCount} {sampleCount === 1 ? "sample" : "samples"}.
          </p>
        )}
      </fieldset>
      <div>
        <label className="label" htmlFor="site-label-address">
          Address printed in front of label codes (optional)
        </label>
        <input
          id="site-label-address"
          className="field font-mono"
          disabled={!canEdit}
          placeholder="https://loamwork.example.org"
          value={address}
          onChange={(e) => setAddress(e.target.value)}
          aria-describedby="site-label-address-error"
        />
        <p className="text-sm text-ink-soft">
          With it, any phone camera opens a label&apos;s record; without it, Loamwork&apos;s own scanner reads the code.
        </p>
        <p id="site-label-address-error" className="field-error" aria-live="polite">
          {fieldErrors.labelAddress?.join(" ") ?? ""}
        </p>
      </div>
      {canEdit && (
        <div className="flex items-center gap-3">
          <button className="btn-primary" type="submit">
            Save numbers and labels
          </button>
          <span role="status" aria-live="polite" className={note?.ok ? "font-semibold text-ok" : "field-error"}>
            {note?.text ?? ""}
          </span>
        </div>
      )}
    </form>
  );
}
