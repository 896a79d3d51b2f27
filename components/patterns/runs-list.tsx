"use client";

import { depthWords } from "@/lib/levels/depth-words";
import { useDates } from "@/components/locale";
import type { RunView } from "@/lib/api/patterns-responses";

type Props = {
  runs: Omit<RunView, "result">[];
  current: string | null;
  compare: string[];
  onOpen: (id: string) => void;
  onToggleCompare: (id: string) => void;
};

const STATUS: Record<RunView["status"], string> = {
  queued: "queued",
  running: "running",
  done: "done",
  failed: "failed",
  cancelled: "cancelled",
};

/** Saved runs, newest first, with the out-of-date mark; pick one to read or two to compare. */
export function RunsList({ runs, current, compare, onOpen, onToggleCompare }: Props) {
  const { when } = useDates();
  if (!runs.length) return <p className="text-sm text-ink-soft">No runs saved on this site yet.</p>;
  return (
    // On a phone the table scrolls inside its own box; the page itself never scrolls sideways.
    <div className="overflow-x-auto">
      <table className="ledger" aria-label="Saved runs">
        <thead>
          <tr>
            <th>When</th>
            <th>Scope</th>
            <th>Tests</th>
            <th className="num">Seed</th>
            <th>Status</th>
            <th>Compare</th>
            <th></th>
          </tr>
        </thead>
        <tbody>
          {runs.map((r) => (
            <tr
              key={r.id}
              aria-current={r.id === current ? "true" : undefined}
              className={r.id === current ? "bg-accent-light" : ""}
            >
              <td className="num whitespace-nowrap">{when(r.createdAt)}</td>
              <td>
                Trench {r.params.names.trench} · {r.params.names.contexts.join(", ")}
                {r.params.depth ? ` (${depthWords(r.params.depth)})` : ""} · {r.params.names.classes.join(" ")}
              </td>
              <td className="text-xs">
                {[...new Set(r.params.tests.map((t) => t.type))].join(", ")} · {r.params.nsim} sims
              </td>
              <td className="num">{r.seed}</td>
              <td>
                {STATUS[r.status]}
                {r.outOfDate && (
                  <span
                    className="ml-2 rounded border border-warn px-1 text-xs font-bold text-warn"
                    title="Records read by this run have changed since"
                  >
                    out of date
                  </span>
                )}
              </td>
              <td>
                <label className="flex min-h-11 items-center gap-1 text-sm">
                  <input
                    type="checkbox"
                    className="size-5"
                    checked={compare.includes(r.id)}
                    disabled={r.status !== "done" || (compare.length >= 2 && !compare.includes(r.id))}
                    onChange={() => onToggleCompare(r.id)}
                    aria-label={`Compare run of ${when(r.createdAt)}`}
                  />
                </label>
              </td>
              <td>
                <button type="button" className="btn min-h-11 px-3 text-sm" onClick={() => onOpen(r.id)}>
                  Open
                </button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
