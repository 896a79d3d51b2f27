"use client";

import type { RunView } from "@/lib/api/patterns-responses";
import { fmtDuration } from "./words";

/** Progress bar with time remaining (elapsed × (1 − p) / p on the server's clock) and a cancel button. */
export function RunProgress({
  run,
  onCancel,
  cancelling,
  canCancel,
}: {
  run: RunView;
  onCancel: () => void;
  cancelling: boolean;
  canCancel: boolean;
}) {
  const pct = Math.round(run.progress * 100);
  const elapsed = run.startedAt ? Date.parse(run.now) - Date.parse(run.startedAt) : 0;
  const remaining = run.progress > 0.02 ? (elapsed * (1 - run.progress)) / run.progress : NaN;
  return (
    <section className="sheet space-y-2" aria-label="Run progress">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="font-bold">
          {run.status === "queued" ? "Waiting for a free worker…" : `Running ${run.params.nsim} simulations per test…`}
        </p>
        <p className="num text-sm" aria-live="polite">
          {pct} % · {run.status === "queued" ? "not started" : `${fmtDuration(remaining)} left`}
        </p>
      </div>
      <div
        role="progressbar"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct}
        aria-label="Simulations done"
        className="h-4 w-full overflow-hidden rounded border border-ink/40 bg-paper-deep"
      >
        {/* Steps, not an animation: progress arrives every tenth of a second or so, and an animated bar
            would have the browser drawing frames throughout the run, on the cores the simulations need. */}
        <div className="h-full w-full origin-left bg-accent" style={{ transform: `scaleX(${pct / 100})` }} />
      </div>
      <p className="text-xs text-ink-soft">
        The run continues on the server if you leave or reload this page; it is saved with its seed{" "}
        <span className="num">{run.seed}</span>.
      </p>
      {canCancel && (
        <button type="button" className="btn-danger" onClick={onCancel} disabled={cancelling}>
          {cancelling ? "Cancelling…" : "Cancel run"}
        </button>
      )}
    </section>
  );
}
