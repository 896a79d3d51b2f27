"use client";

import { memo } from "react";
import type { ClassRow, ContextRow, FindRow } from "./rows";
import { SymbolIcon } from "./symbols";

/** Per-class and per-context visibility of finds on the plan, with counts. */
export const LayersPanel = memo(function LayersPanel({
  classes,
  contexts,
  finds,
  hiddenClasses,
  hiddenContexts,
  onToggleClass,
  onToggleContext,
  photoOpacity,
  onPhotoOpacity,
  hasPhoto,
}: {
  classes: ClassRow[];
  contexts: ContextRow[];
  finds: FindRow[];
  hiddenClasses: ReadonlySet<string>;
  hiddenContexts: ReadonlySet<string>;
  onToggleClass: (id: string) => void;
  onToggleContext: (id: string) => void;
  photoOpacity: number;
  onPhotoOpacity: (v: number) => void;
  hasPhoto: boolean;
}) {
  const countBy = (key: "classId" | "contextId", id: string) => finds.filter((f) => f[key] === id).length;
  return (
    <div className="space-y-4">
      <fieldset>
        <legend className="label">Classes</legend>
        {classes.map((c) => (
          <label key={c.id} className="flex min-h-11 cursor-pointer items-center gap-3 px-1">
            <input
              type="checkbox"
              className="h-6 w-6 accent-accent"
              checked={!hiddenClasses.has(c.id)}
              onChange={() => onToggleClass(c.id)}
            />
            <SymbolIcon symbol={c.symbol} colour={c.colour} size={20} />
            <span className="flex-1">
              {c.code} · {c.label}
            </span>
            <span className="num text-sm text-ink-soft">{countBy("classId", c.id)}</span>
          </label>
        ))}
      </fieldset>
      <fieldset>
        <legend className="label">Contexts</legend>
        {contexts.map((c) => (
          <label key={c.id} className="flex min-h-11 cursor-pointer items-center gap-3 px-1">
            <input
              type="checkbox"
              className="h-6 w-6 accent-accent"
              checked={!hiddenContexts.has(c.id)}
              onChange={() => onToggleContext(c.id)}
            />
            <span className="num font-bold">{c.number}</span>
            <span className="flex-1">
              {c.type}
              {c.state === "signed_off" ? " · signed off" : c.state === "awaiting" ? " · awaiting sign-off" : ""}
            </span>
            <span className="num text-sm text-ink-soft">{countBy("contextId", c.id)}</span>
          </label>
        ))}
      </fieldset>
      {hasPhoto && (
        <label className="block">
          <span className="label">Photo strength</span>
          <input
            type="range"
            min={0}
            max={1}
            step={0.05}
            value={photoOpacity}
            onChange={(e) => onPhotoOpacity(Number(e.target.value))}
            className="h-11 w-full accent-accent"
          />
        </label>
      )}
    </div>
  );
});
