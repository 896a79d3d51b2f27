"use client";

import { useEffect, useState, type FormEvent } from "react";
import { ApiError, apiClient, keptOnDevice } from "@/lib/api/client";
import { contextTypes } from "@/lib/schemas/context";
import { readingLabels, relationReadings, type RelationReading } from "@/lib/schemas/relation";
import { device } from "@/lib/offline/device";
import { cachedContexts, cachedTrenches, type CachedContext } from "@/lib/offline/relations";

type Trench = { id: string; code: string };

/**
 * Opening a context sheet in the trench, online or not: its number comes from this device's block at once
 * (bag labels carry it), and one relation to a context already on the site can be added with it; the loop
 * check runs here on every relation the device knows, and again on the server. The full sheet is filled
 * on the context's own page once it has reached the server.
 */
export function QuickContextForm({ siteId }: { siteId: string }) {
  const [trenches, setTrenches] = useState<Trench[]>([]);
  const [others, setOthers] = useState<CachedContext[]>([]);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const box = device.box;
  useEffect(() => {
    if (!box) return;
    void cachedTrenches(box, siteId).then(setTrenches);
    void cachedContexts(box, siteId).then(setOthers);
  }, [box, siteId]);
  if (!box) return null;

  const submit = async (ev: FormEvent<HTMLFormElement>) => {
    ev.preventDefault();
    const f = new FormData(ev.currentTarget);
    const trenchId = String(f.get("trenchId") ?? "");
    if (!trenchId) return setMessage({ ok: false, text: "Pick the trench the context is in." });
    setBusy(true);
    setMessage(null);
    try {
      const number = await box.takeNumber(siteId, "context");
      if (number === null)
        throw new Error("This device holds no context numbers for this site: connect once so it can reserve a block.");
      const made = await apiClient.call(
        "contextsCreate",
        { siteId },
        {
          trenchId,
          number,
          type: String(f.get("type")) as (typeof contextTypes)[number],
          description: String(f.get("description") ?? ""),
        },
      );
      const otherId = String(f.get("otherId") ?? "");
      let related = "";
      if (otherId) {
        const reading = String(f.get("reading")) as RelationReading;
        await apiClient.call("relationsCreate", { siteId }, { contextId: made.id, reading, otherId });
        related = ` ${readingLabels[reading]} ${others.find((o) => o.id === otherId)?.number ?? ""}`;
      }
      setMessage({
        ok: true,
        text: `Context ${number}${related} ${keptOnDevice(made) ? "kept on this device; it is sent when the server can be reached." : "opened."}`,
      });
      ev.currentTarget?.reset();
      await device.refresh();
    } catch (err) {
      setMessage({ ok: false, text: err instanceof ApiError || err instanceof Error ? err.message : String(err) });
    } finally {
      setBusy(false);
    }
  };

  return (
    <form
      onSubmit={(e) => void submit(e)}
      aria-label="Open a context sheet"
      className="mt-4 space-y-2 border-t border-paper-edge pt-3"
    >
      <h3 className="font-bold">Open a context sheet</h3>
      <p className="text-sm text-ink-soft">
        Its number comes from this device&apos;s block, so it can go on bag labels now.
      </p>
      <div className="grid grid-cols-2 gap-2">
        <label>
          <span className="label">Trench</span>
          <select name="trenchId" className="field" defaultValue="">
            <option value="">— pick —</option>
            {trenches.map((t) => (
              <option key={t.id} value={t.id}>
                {t.code}
              </option>
            ))}
          </select>
        </label>
        <label>
          <span className="label">Type</span>
          <select name="type" className="field" defaultValue="deposit">
            {contextTypes.map((t) => (
              <option key={t} value={t}>
                {t}
              </option>
            ))}
          </select>
        </label>
      </div>
      <label className="block">
        <span className="label">Description</span>
        <textarea name="description" className="field" rows={2} />
      </label>
      <div className="grid grid-cols-2 gap-2">
        <label>
          <span className="label">Relation</span>
          <select name="reading" className="field" defaultValue="above">
            {relationReadings.map((r) => (
              <option key={r} value={r}>
                {readingLabels[r]}
              </option>
            ))}
          </select>
        </label>
        <label>
          <span className="label">Other context</span>
          <select name="otherId" className="field num" defaultValue="">
            <option value="">— none —</option>
            {others.map((o) => (
              <option key={o.id} value={o.id}>
                {o.number}
              </option>
            ))}
          </select>
        </label>
      </div>
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? "Opening…" : "Open context sheet"}
      </button>
      {message && (
        <p role={message.ok ? "status" : "alert"} className={message.ok ? "text-ok" : "field-error"}>
          {message.text}
        </p>
      )}
    </form>
  );
}
