"use client";

import { useEffect, useState } from "react";
import { apiClient } from "@/lib/api/client";
import { device, exportOutbox, type DeviceSnapshot } from "@/lib/offline/device";
import { LOW_NUMBERS } from "@/lib/offline/number-blocks";
import type { OutboxEntry } from "@/lib/offline/outbox-db";
import { cachedContexts, type CachedContext } from "@/lib/offline/relations";
import { choicesFor, discard, keepMine, moveToContext, retry, type Resolution } from "@/lib/offline/resolve";
import { STORAGE_WARNING_SHARE } from "./device-status";
import { QuickContextForm } from "./quick-context-form";

const words: Record<Resolution, string> = {
  move: "Move to an open context",
  "keep-mine": "Keep mine",
  "take-theirs": "Take theirs",
  discard: "Discard",
  retry: "Send again",
};
const mb = (bytes: number) => `${(bytes / 1e6).toFixed(1)} MB`;

/** Downloads the outbox as a JSON file (before signing out, or to hand it over by other means). */
export function downloadOutbox(entries: OutboxEntry[]) {
  const url = URL.createObjectURL(exportOutbox(entries));
  const a = document.createElement("a");
  a.href = url;
  a.download = `loamwork-outbox-${new Date().toISOString().slice(0, 19).replace(/:/g, "")}.json`;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** The device sheet: what waits to be sent, what needs attention and how to resolve it, numbers and storage. */
export function DevicePanel({
  snapshot: s,
  siteId,
  canRecord,
  onClose,
}: {
  snapshot: DeviceSnapshot;
  siteId: string | null;
  canRecord: boolean;
  onClose: () => void;
}) {
  const waiting = s.entries.filter((e) => e.state === "waiting");
  const attention = s.entries.filter((e) => e.state === "attention");
  const storageShare = s.storage ? s.storage.usage / s.storage.quota : 0;
  return (
    <div
      role="dialog"
      aria-label="This device"
      className="fixed inset-x-0 bottom-0 z-50 max-h-[85vh] overflow-auto rounded-t-lg border-2 border-ink/40 bg-paper p-4 shadow-xl sm:absolute sm:inset-auto sm:right-0 sm:top-12 sm:w-[28rem] sm:rounded-lg"
    >
      <div className="flex items-center gap-2">
        <h2 className="text-lg font-bold">This device</h2>
        <button type="button" className="btn ml-auto" onClick={onClose}>
          Close
        </button>
      </div>
      <p className="mt-1 text-sm text-ink-soft">
        {s.phase === "sign-in"
          ? "The server asked you to sign in again: nothing is lost, the outbox waits."
          : s.online
            ? "Connected."
            : "No connection: what you record is kept here until it can be sent."}
        {s.lastSynced && ` Last synced ${new Date(s.lastSynced).toLocaleString()}.`}
      </p>
      {s.phase === "sign-in" && (
        <a className="btn-primary mt-2" href="/sign-in">
          Sign in again
        </a>
      )}
      <div className="mt-3 flex flex-wrap gap-2">
        <button
          type="button"
          className="btn"
          onClick={() => device.setOnline(navigator.onLine)}
          disabled={waiting.length === 0}
        >
          Send now
        </button>
        <button
          type="button"
          className="btn"
          onClick={() => downloadOutbox(s.entries)}
          disabled={s.entries.length === 0}
        >
          Save the outbox as a file
        </button>
      </div>

      {canRecord && siteId && (
        <dl className="mt-3 grid grid-cols-2 gap-1 text-sm" data-testid="numbers-left">
          <dt>Find numbers on this device</dt>
          <dd className={`num ${s.numbers.find !== null && s.numbers.find < LOW_NUMBERS ? "font-bold text-warn" : ""}`}>
            {s.numbers.find ?? "—"} left
          </dd>
          <dt>Context numbers</dt>
          <dd className="num">{s.numbers.context ?? "—"} left</dd>
        </dl>
      )}
      {canRecord && s.numbers.find !== null && s.numbers.find < LOW_NUMBERS && (
        <p role="alert" className="mt-1 text-sm font-semibold text-warn">
          Fewer than {LOW_NUMBERS} find numbers left on this device: connect so it can reserve another block.
        </p>
      )}
      {s.storage && (
        <p
          className={`mt-2 text-sm ${storageShare > STORAGE_WARNING_SHARE ? "font-semibold text-warn" : "text-ink-soft"}`}
          role={storageShare > STORAGE_WARNING_SHARE ? "alert" : undefined}
        >
          Loamwork uses {mb(s.storage.usage)} of the {mb(s.storage.quota)} this browser allows.
          {storageShare > STORAGE_WARNING_SHARE &&
            " Nearly full: send the outbox and close pages you no longer need offline."}
        </p>
      )}

      <h3 className="mt-4 font-bold">Waiting to be sent ({waiting.length})</h3>
      {waiting.length === 0 ? (
        <p className="text-sm text-ink-soft">Nothing waits.</p>
      ) : (
        <ol className="mt-1 space-y-1" data-testid="outbox-waiting">
          {waiting.map((e) => (
            <WaitingRow key={e.seq} e={e} />
          ))}
        </ol>
      )}

      <h3 className="mt-4 font-bold">Needs attention ({attention.length})</h3>
      {attention.length === 0 ? (
        <p className="text-sm text-ink-soft">Nothing was refused.</p>
      ) : (
        <ol className="mt-1 space-y-2" data-testid="needs-attention">
          {attention.map((e) => (
            <AttentionRow key={e.seq} e={e} canRecord={canRecord} />
          ))}
        </ol>
      )}
      {canRecord && siteId && <QuickContextForm siteId={siteId} />}
    </div>
  );
}

function WaitingRow({ e }: { e: OutboxEntry }) {
  const unsentFind = e.operation === "findsCreate" && e.localId;
  return (
    <li className="flex min-h-11 items-center gap-2 text-sm">
      <span className="num">{e.label}</span>
      <span className="text-ink-faint">{new Date(e.createdAt).toLocaleTimeString()}</span>
      {unsentFind && (
        <button
          type="button"
          className="btn ml-auto px-3"
          aria-label={`Delete unsent ${e.label}`}
          onClick={() =>
            void apiClient.call("findDelete", { siteId: e.siteId, findId: e.localId! }).then(() => device.refresh())
          }
        >
          Delete
        </button>
      )}
    </li>
  );
}

function AttentionRow({ e, canRecord }: { e: OutboxEntry; canRecord: boolean }) {
  const [moving, setMoving] = useState(false);
  const [open, setOpen] = useState<CachedContext[]>([]);
  const [error, setError] = useState<string | null>(null);
  const box = device.box;
  useEffect(() => {
    if (moving && box) void cachedContexts(box, e.siteId).then((cs) => setOpen(cs.filter((c) => c.state === "open")));
  }, [moving, box, e.siteId]);
  if (!box) return null;
  const act = async (r: Resolution) => {
    setError(null);
    try {
      if (r === "move") return setMoving(true);
      if (r === "keep-mine") await keepMine(box, e);
      else if (r === "take-theirs" || r === "discard") await discard(box, e, r);
      else await retry(box, e);
      await device.refresh();
      device.kick();
    } catch (err) {
      setError((err as Error).message);
    }
  };
  return (
    <li
      className="rounded border border-warn/50 bg-warn-light/40 p-2 text-sm"
      data-testid="attention-entry"
      data-code={e.refusal?.code ?? ""}
    >
      <p className="font-semibold num">{e.label}</p>
      <p>
        {e.refusal?.message}
        {e.refusal?.code ? <span className="ml-1 font-mono text-xs">({e.refusal.code})</span> : null}
      </p>
      <div className="mt-1 flex flex-wrap gap-2">
        {choicesFor(e, canRecord).map((r) => (
          <button key={r} type="button" className={r === "discard" ? "btn-danger" : "btn"} onClick={() => void act(r)}>
            {words[r]}
          </button>
        ))}
      </div>
      {moving && (
        <label className="mt-2 block">
          <span className="label">Move to context</span>
          <select
            className="field num"
            defaultValue=""
            onChange={async (ev) => {
              const c = open.find((x) => x.id === ev.target.value);
              if (!c) return;
              await moveToContext(box, e, c.id, c.number);
              await device.refresh();
              device.kick();
            }}
          >
            <option value="">— pick an open context —</option>
            {open.map((c) => (
              <option key={c.id} value={c.id}>
                {c.number}
              </option>
            ))}
          </select>
        </label>
      )}
      {error && (
        <p className="field-error" role="alert">
          {error}
        </p>
      )}
    </li>
  );
}
