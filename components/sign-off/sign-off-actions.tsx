"use client";

import { useId, useState } from "react";
import type { Context, Role } from "@/lib/server/reads/row-types";
import { apiClient } from "@/lib/api/client";
import { useSignOffNotice } from "./sign-off-notice";
import { countOf } from "@/lib/words/count";

type Props = { siteId: string; contextId: string; number: number; state: Context["state"]; role: Role; ready: boolean };

/** The buttons of one context in the sign-off flow, as the caller's role allows; the server checks again. */
export function SignOffActions({ siteId, contextId, number, state, role, ready }: Props) {
  const announce = useSignOffNotice();
  const reasonId = useId();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [note, setNote] = useState<string | null>(null);
  const [asking, setAsking] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [reason, setReason] = useState("");

  const send = (step: "submit" | "lock" | "reopen") =>
    step === "submit"
      ? apiClient.call("contextSubmit", { siteId, contextId })
      : step === "lock"
        ? apiClient.call("contextSignOff", { siteId, contextId })
        : apiClient.call("contextReopen", { siteId, contextId }, { reason });

  async function run(step: "submit" | "lock" | "reopen") {
    setBusy(true);
    setError(null);
    try {
      const out = await send(step);
      const m = out.mail;
      const what = {
        submit: `Context ${number} submitted for sign-off`,
        lock: `Context ${number} signed off`,
        reopen: `Context ${number} ${state === "signed_off" ? "reopened" : "returned to open"}`,
      }[step];
      const text = `${what}; ${m ? (m.failed ? `${countOf(m.failed, "e-mail")} could not be sent.` : `${countOf(m.sent, "e-mail")} sent.`) : "done."}`;
      if (announce) announce({ text, tone: m?.failed ? "error" : "ok" });
      else setNote(text);
      setAsking(false);
      setConfirming(false);
      setReason("");
    } catch (err) {
      setError((err as Error).message);
    } finally {
      setBusy(false);
    }
  }

  const director = role === "director";
  const reopenWord = state === "signed_off" ? "Reopen" : "Return";
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-2">
        {state === "open" && role !== "specialist" && (
          <button
            className="btn-primary"
            disabled={busy || !ready}
            onClick={() => run("submit")}
            title={ready ? undefined : "Complete the sheet first"}
          >
            Submit {number} for sign-off
          </button>
        )}
        {state === "awaiting" && director && !confirming && (
          <button className="btn-primary" disabled={busy || !ready} onClick={() => setConfirming(true)}>
            Sign off {number}
          </button>
        )}
        {state !== "open" && director && !asking && (
          <button className="btn" disabled={busy} onClick={() => setAsking(true)}>
            {reopenWord} {number}…
          </button>
        )}
      </div>
      {confirming && (
        <div
          role="alertdialog"
          aria-labelledby={`${reasonId}-lock`}
          className="space-y-2 rounded border-2 border-accent p-3"
        >
          <p id={`${reasonId}-lock`}>
            Sign off context <span className="num">{number}</span>? Its sheet, its finds and its relations will be
            locked: nobody can change them, on any screen or by import, until a director reopens the context with a
            reason.
          </p>
          <div className="flex gap-2">
            <button className="btn-primary" type="button" disabled={busy} onClick={() => run("lock")} autoFocus>
              Lock context {number}
            </button>
            <button className="btn" type="button" onClick={() => setConfirming(false)}>
              Cancel
            </button>
          </div>
        </div>
      )}
      {asking && (
        <form
          className="space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            run("reopen");
          }}
        >
          <label className="label" htmlFor={reasonId}>
            Why {reopenWord.toLowerCase()} context {number}? Every member is told, and the reason stays in the record
            trail.
          </label>
          <textarea
            id={reasonId}
            className="field min-h-24"
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            required
            minLength={10}
          />
          <div className="flex gap-2">
            <button className="btn-danger" type="submit" disabled={busy || reason.trim().length < 10}>
              {reopenWord} with this reason
            </button>
            <button className="btn" type="button" onClick={() => setAsking(false)}>
              Cancel
            </button>
          </div>
        </form>
      )}
      <p className="field-error" role="alert" aria-live="polite">
        {error}
      </p>
      {note && !error && (
        <p className="text-sm text-ok" aria-live="polite">
          {note}
        </p>
      )}
    </div>
  );
}
