"use client";

import { useVirtualizer } from "@tanstack/react-virtual";
import { memo, useDeferredValue, useEffect, useId, useMemo, useRef, useState } from "react";
import { countOf } from "@/lib/words/count";
import type { ClassRow, FindRow } from "./rows";
import { SymbolIcon } from "./symbols";

const ROW_PX = 45;

/**
 * Whether a find answers a search: every word must match its number ("#231" or "231"), its context
 * ("1004" or "ctx 1004") or its class (code or label).
 */
export function findMatches(f: FindRow, query: string): boolean {
  const words = query
    .toLowerCase()
    .replace(/\bctx\s+/g, "ctx:")
    .split(/\s+/)
    .filter(Boolean);
  return words.every((w) => {
    if (w.startsWith("ctx:")) return String(f.contextNumber).startsWith(w.slice(4));
    const bare = w.replace(/^#/, "");
    if (/^\d+$/.test(bare))
      return String(f.number).startsWith(bare) || (!w.startsWith("#") && String(f.contextNumber).startsWith(bare));
    return f.classCode.toLowerCase().includes(w) || f.classLabel.toLowerCase().includes(w);
  });
}

/**
 * The side list of every find shown on the plan, newest first, searchable by number, class and context.
 * Only the rows in sight are drawn (a trench holds thousands of finds); its selection is the plan's
 * selection, and a find selected on the plan is scrolled into the list.
 */
export const FindsList = memo(function FindsList({
  finds,
  classes,
  selected,
  onSelect,
}: {
  finds: FindRow[];
  classes: Map<string, ClassRow>;
  selected: ReadonlySet<string>;
  onSelect: (f: FindRow, additive: boolean) => void;
}) {
  const searchId = useId();
  const [query, setQuery] = useState("");
  const deferred = useDeferredValue(query);
  const sorted = useMemo(() => [...finds].sort((a, b) => b.number - a.number), [finds]);
  const shown = useMemo(
    () => (deferred.trim() ? sorted.filter((f) => findMatches(f, deferred)) : sorted),
    [sorted, deferred],
  );
  const scroller = useRef<HTMLDivElement>(null);
  const rows = useVirtualizer({
    count: shown.length,
    getScrollElement: () => scroller.current,
    estimateSize: () => ROW_PX,
    overscan: 8,
  });

  const firstPicked = useMemo(() => shown.findIndex((f) => selected.has(f.id)), [shown, selected]);
  useEffect(() => {
    if (firstPicked >= 0) rows.scrollToIndex(firstPicked, { align: "auto" });
  }, [firstPicked, rows]);

  return (
    <div className="flex h-full flex-col">
      <label className="label" htmlFor={searchId}>
        Search finds
      </label>
      <input
        id={searchId}
        type="search"
        className="field"
        placeholder="number, class or context"
        value={query}
        onChange={(e) => setQuery(e.target.value)}
        aria-describedby={`${searchId}-count`}
      />
      <p id={`${searchId}-count`} className="my-2 text-sm text-ink-soft" aria-live="polite">
        {deferred.trim()
          ? `${countOf(shown.length, "find")} of ${finds.length} match.`
          : `${countOf(finds.length, "find")} shown.`}{" "}
        {selected.size > 0 ? `${selected.size} selected. ` : ""}Tap one to select it on the plan.
      </p>
      <div
        ref={scroller}
        className="min-h-64 flex-1 overflow-auto"
        style={{ maxHeight: "70vh" }}
        data-testid="finds-list-scroller"
      >
        <ul aria-label="Finds on the plan" className="relative w-full" style={{ height: rows.getTotalSize() }}>
          {rows.getVirtualItems().map((item) => {
            const f = shown[item.index];
            // The list may shrink under the virtualiser between its count and this render.
            if (!f) return null;
            const cls = classes.get(f.classId);
            const on = selected.has(f.id);
            return (
              <li
                key={f.id}
                className="absolute left-0 top-0 w-full border-b border-paper-edge"
                style={{ height: ROW_PX, transform: `translateY(${item.start}px)` }}
              >
                <button
                  type="button"
                  aria-pressed={on}
                  onClick={(e) => onSelect(f, e.shiftKey || e.ctrlKey || e.metaKey)}
                  className={`flex h-full w-full items-center gap-2 px-2 text-left ${on ? "bg-accent-light outline outline-2 -outline-offset-2 outline-accent" : "hover:bg-paper-deep"}`}
                  data-find-number={f.number}
                >
                  <SymbolIcon symbol={cls?.symbol ?? "disc"} colour={cls?.colour ?? "#666"} />
                  <span className="num w-16 font-bold">#{f.number}</span>
                  <span className="flex-1 truncate">
                    {f.classCode} · ctx {f.contextNumber}
                    {f.contextState === "signed_off" ? " · signed off" : ""}
                  </span>
                  <span className="num text-xs text-ink-soft">
                    {f.x.toFixed(2)}, {f.y.toFixed(2)}
                  </span>
                </button>
              </li>
            );
          })}
        </ul>
      </div>
    </div>
  );
});
