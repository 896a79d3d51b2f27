"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { ApiError, apiClient, keptOnDevice } from "@/lib/api/client";

/**
 * A box's entry: its number (the next free one when left blank on a new box), the store it is kept in and a
 * note. Adds a box, or changes one when `box` is given; through the device's write path, so with no connection
 * the box waits in the outbox.
 */
export function BoxForm({
  siteId,
  box,
}: {
  siteId: string;
  box?: { id: string; number: number; store: string; note: string };
}) {
  const router = useRouter();
  const [number, setNumber] = useState(box ? String(box.number) : "");
  const [store, setStore] = useState(box?.store ?? "");
  const [note, setNote] = useState(box?.note ?? "");
  const [failed, setFailed] = useState<ApiError | null>(null);
  const [said, setSaid] = useState<string | null>(null);
  const p = box ? `box-${box.id}` : "new-box";

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setFailed(null);
    setSaid(null);
    try {
      let pending = false;
      if (box) {
        const saved = await apiClient.call("boxUpdate", { siteId, boxId: box.id }, {
          ...(number.trim() && { number: number.trim() }),
          store,
          note,
        } as never);
        pending = keptOnDevice(saved);
        setSaid(
          pending
            ? "No connection: the change waits on this device and is sent when the connection is back."
            : "Saved.",
        );
      } else {
        const made = await apiClient.call("boxesCreate", { siteId }, {
          ...(number.trim() && { number: number.trim() }),
          store,
          note,
        } as never);
        pending = keptOnDevice(made);
        setSaid(
          pending
            ? `No connection: ${made.number ? `box ${made.number}` : "the new box"} waits on this device and is added when the connection is back${made.number ? "" : " (it takes the next number then)"}.`
            : `Box ${made.number} added.`,
        );
        setNumber("");
        setNote("");
      }
      // Offline, reading the page again would fail and lose what is on screen; the sync refreshes it later.
      if (!pending) router.refresh();
    } catch (err) {
      if (err instanceof ApiError) setFailed(err);
      else throw err;
    }
  }

  const error = (field: string) =>
    failed?.fieldErrors[field]?.length ? (
      <p className="field-error" aria-live="polite">
        {failed.fieldErrors[field]!.join(" ")}
      </p>
    ) : null;

  return (
    <form onSubmit={save} className="sheet space-y-3" aria-label={box ? `Change box ${box.number}` : "Add a box"}>
      <div className="grid gap-3 sm:grid-cols-[8rem_1fr_1fr]">
        <div>
          <label className="label" htmlFor={`${p}-number`}>
            Box number
          </label>
          <input
            id={`${p}-number`}
            className="field num"
            inputMode="numeric"
            value={number}
            placeholder={box ? undefined : "next"}
            onChange={(e) => setNumber(e.target.value)}
          />
          {error("number")}
        </div>
        <div>
          <label className="label" htmlFor={`${p}-store`}>
            Store and place in it
          </label>
          <input
            id={`${p}-store`}
            className="field"
            value={store}
            placeholder="Finds store, bay 3"
            onChange={(e) => setStore(e.target.value)}
          />
          {error("store")}
        </div>
        <div>
          <label className="label" htmlFor={`${p}-note`}>
            Note
          </label>
          <input id={`${p}-note`} className="field" value={note} onChange={(e) => setNote(e.target.value)} />
          {error("note")}
        </div>
      </div>
      {failed && (
        <p role="alert" className="field-error">
          {failed.message}
        </p>
      )}
      <button type="submit" className="btn-primary">
        {box ? "Save the box" : "Add a box"}
      </button>
      <p aria-live="polite">{said}</p>
    </form>
  );
}
