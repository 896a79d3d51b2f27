"use client";

import { useCallback, useMemo, useState } from "react";
import type { Tap } from "./plan-canvas";
import type { FindRow } from "./rows";

function toggle(set: ReadonlySet<string>, id: string): ReadonlySet<string> {
  const next = new Set(set);
  if (next.has(id)) next.delete(id);
  else next.add(id);
  return next;
}

/** Which finds are selected, which classes and contexts are hidden, and so which finds the plan shows. */
export function useFindLayers(finds: FindRow[], bringIntoView: (f: FindRow) => void) {
  const [selected, setSelected] = useState<ReadonlySet<string>>(new Set());
  const [hiddenClasses, setHiddenClasses] = useState<ReadonlySet<string>>(new Set());
  const [hiddenContexts, setHiddenContexts] = useState<ReadonlySet<string>>(new Set());
  // Stable callbacks so the memoised layers panel does not redraw on every plan render.
  const toggleClass = useCallback((id: string) => setHiddenClasses((s) => toggle(s, id)), []);
  const toggleContext = useCallback((id: string) => setHiddenContexts((s) => toggle(s, id)), []);
  const visible = useMemo(
    () => finds.filter((f) => !hiddenClasses.has(f.classId) && !hiddenContexts.has(f.contextId)),
    [finds, hiddenClasses, hiddenContexts],
  );

  /** A tap with the look tool: selects the find (Shift adds or removes it), or clears the selection. */
  const tapFind = (find: Tap["find"], additive: boolean) => {
    if (find)
      setSelected((s) =>
        additive ? new Set(s.has(find.id) ? [...s].filter((i) => i !== find.id) : [...s, find.id]) : new Set([find.id]),
      );
    else setSelected(new Set());
  };

  /** Selects the finds with these numbers (those a refused outline would leave outside). */
  const selectNumbers = (numbers: unknown[]) =>
    setSelected(new Set(finds.filter((f) => numbers.includes(f.number)).map((f) => f.id)));

  /** A find picked in the list: selected (Shift adds it) and, when picked alone, brought into sight. */
  const selectFromList = useCallback(
    (f: FindRow, add: boolean) => {
      setSelected((s) => (add ? new Set([...s, f.id]) : new Set([f.id])));
      if (!add) bringIntoView(f);
    },
    [bringIntoView],
  );

  return {
    selectFromList,
    selected,
    setSelected,
    hiddenClasses,
    hiddenContexts,
    toggleClass,
    toggleContext,
    visible,
    tapFind,
    selectNumbers,
  };
}
