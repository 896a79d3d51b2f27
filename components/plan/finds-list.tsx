"use client";

import { memo, useEffect, useMemo, useRef } from "react";
import type { ClassRow, FindRow } from "./rows";
import { SymbolIcon } from "./symbols";

const LIMIT = 300;

/** The side list of the finds shown on the plan; its selection is the plan's selection. */
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
  const sorted = useMemo(() => [...finds].sort((a, b) => b.number - a.number), [finds]);
  const picked = sorted.filter((f) => selected.has(f.id));
  const rest = sorted.filter((f) => !selected.has(f.id)).slice(0, Math.max(0, LIMIT - picked.length));
  const shown = [...picked, ...rest];
  const first = useRef<HTMLButtonElement>(null);
  const firstPickedId = picked.length ? picked[0].id : null;
  useEffect(() => {
    first.current?.scrollIntoView({ block: "nearest" });
  }, [firstPickedId]);
  return (
    <div>
      <p className="mb-2 text-sm text-ink-soft">
        {finds.length} find{finds.length === 1 ? "" : "s"} shown
        {finds.length > shown.length ? `; the newest ${shown.length} listed` : ""}. Tap one to select it on the plan.
      </p>
      <ul className="divide-y divide-paper-edge" aria-label="Finds on the plan">
        {shown.map((f, i) => {
          const cls = classes.get(f.classId);
          const on = selected.has(f.id);
          return (
            <li key={f.id}>
              <button
                ref={i === 0 && on ? first : undefined}
                type="button"
                aria-pressed={on}
                onClick={(e) => onSelect(f, e.shiftKey || e.ctrlKey || e.metaKey)}
                className={`flex min-h-11 w-full items-center gap-2 px-2 py-1 text-left ${on ? "bg-accent-light outline outline-2 outline-accent" : "hover:bg-paper-deep"}`}
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
  );
});
