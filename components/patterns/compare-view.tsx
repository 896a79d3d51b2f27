"use client";

import { useDates } from "@/components/locale";
import { RunResultView } from "./run-result";
import { useRun } from "./use-run";

/** Two finished runs side by side (same scope with another seed, another context, another correction…). */
export function CompareView({ siteId, ids, onClose }: { siteId: string; ids: string[]; onClose: () => void }) {
  const { when } = useDates();
  const a = useRun(siteId, ids[0] ?? null);
  const b = useRun(siteId, ids[1] ?? null);
  return (
    <section aria-label="Two runs side by side" className="space-y-3">
      <div className="flex items-center justify-between">
        <h2 className="text-xl font-bold">Side by side</h2>
        <button type="button" className="btn" onClick={onClose}>
          Close comparison
        </button>
      </div>
      <div className="grid gap-4 2xl:grid-cols-2 lg:grid-cols-2">
        {[a, b].map((q, i) => (
          <div key={ids[i]} className="min-w-0 space-y-2">
            <h3 className="font-bold">
              Run {i + 1} · {q.data ? when(q.data.createdAt) : "…"}
            </h3>
            {q.data && <RunResultView run={q.data} compact />}
          </div>
        ))}
      </div>
    </section>
  );
}
