"use client";

import { useRef, useState, useSyncExternalStore, type FormEvent } from "react";
import { clearUserCaches, device } from "@/lib/offline/device";
import { downloadOutbox } from "./device-panel";

/**
 * Signing out on a shared tablet: with work not yet sent, the user is warned and offered to send it or
 * save it as a file first; signing out empties the pages and data this user opened from the device (their
 * outbox stays theirs, for when they sign in again).
 */
export function SignOutForm({ action }: { action: () => Promise<void> }) {
  const s = useSyncExternalStore(device.subscribe, device.getSnapshot, device.getServerSnapshot);
  const [asking, setAsking] = useState(false);
  const form = useRef<HTMLFormElement>(null);
  const unsent = s.waiting + s.attention;
  const leave = async () => {
    await clearUserCaches();
    device.stop();
    form.current?.requestSubmit();
  };
  const onSubmit = (e: FormEvent) => {
    if (device.box === null) return;
    e.preventDefault();
    if (unsent > 0 && !asking) return setAsking(true);
    void leave();
  };
  return (
    <form ref={form} action={action} onSubmit={onSubmit}>
      <button className="btn" type="submit">
        Sign out
      </button>
      {asking && (
        <div
          role="alertdialog"
          aria-label="Unsent work"
          className="fixed inset-x-0 bottom-0 z-50 rounded-t-lg border-2 border-warn bg-paper p-4 shadow-xl sm:absolute sm:inset-auto sm:right-0 sm:top-12 sm:w-96 sm:rounded-lg"
        >
          <p className="font-bold text-warn">
            {unsent} record{unsent === 1 ? "" : "s"} on this device {unsent === 1 ? "has" : "have"} not reached the
            server.
          </p>
          <p className="mt-1 text-sm">
            They stay in your outbox on this device after you sign out, and are sent when you sign in here again. You
            can send them now, or save them as a file.
          </p>
          <div className="mt-2 flex flex-wrap gap-2">
            <button type="button" className="btn-primary" onClick={() => device.setOnline(navigator.onLine)}>
              Send now
            </button>
            <button type="button" className="btn" onClick={() => downloadOutbox(s.entries)}>
              Save as a file
            </button>
            <button type="button" className="btn-danger" onClick={() => void leave()}>
              Sign out anyway
            </button>
            <button type="button" className="btn" onClick={() => setAsking(false)}>
              Stay
            </button>
          </div>
        </div>
      )}
    </form>
  );
}
