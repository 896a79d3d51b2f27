"use client";

import { useState } from "react";
import type { DeviceSnapshot } from "@/lib/offline/device";
import { LOW_NUMBERS } from "@/lib/offline/number-blocks";
import { DevicePanel } from "./device-panel";
import { useDevice } from "./use-device";

/** Storage use above this share of the quota is a warning: the browser may refuse to keep more. */
export const STORAGE_WARNING_SHARE = 0.8;

/** The header's word on the connection and the outbox: online / offline / sending, what waits, when last synced. */
export function DeviceStatus({
  userId,
  siteId,
  renderedAt,
  canRecord,
}: {
  userId: string;
  siteId: string | null;
  renderedAt: string;
  canRecord: boolean;
}) {
  const s = useDevice(userId, siteId);
  const [open, setOpen] = useState(false);
  const state = stateWord(s);
  const low = canRecord && s.numbers.find !== null && s.numbers.find < LOW_NUMBERS;
  const synced = s.lastSynced ?? renderedAt;
  return (
    <div className="relative">
      <button
        type="button"
        className={`btn min-h-11 gap-2 px-3 text-sm ${s.attention || low ? "border-warn text-warn" : ""}`}
        aria-expanded={open}
        aria-haspopup="dialog"
        onClick={() => setOpen(!open)}
        data-testid="device-status"
        data-state={state.key}
        data-waiting={s.waiting}
        data-attention={s.attention}
      >
        <span aria-hidden className={`inline-block h-2.5 w-2.5 rounded-full ${state.dot}`} />
        <span>{state.label}</span>
        {s.waiting > 0 && <span className="num">· {s.waiting} waiting</span>}
        {s.attention > 0 && <span className="num font-bold">· {s.attention} need attention</span>}
        <span className="hidden text-ink-soft sm:inline" title={`Last synced ${new Date(synced).toLocaleString()}`}>
          · synced {new Date(synced).toLocaleTimeString([], { hour: "2-digit", minute: "2-digit" })}
        </span>
      </button>
      {open && <DevicePanel snapshot={s} siteId={siteId} canRecord={canRecord} onClose={() => setOpen(false)} />}
    </div>
  );
}

function stateWord(s: DeviceSnapshot): { key: string; label: string; dot: string } {
  if (s.phase === "sign-in") return { key: "sign-in", label: "Sign in again to send", dot: "bg-warn" };
  if (s.phase === "sending") return { key: "sending", label: "Sending", dot: "bg-accent" };
  if (!s.online || s.phase === "waiting-for-server") return { key: "offline", label: "Offline", dot: "bg-ink-faint" };
  return { key: "online", label: "Online", dot: "bg-ok" };
}
