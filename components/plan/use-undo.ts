"use client";

import { useCallback, useRef, useState } from "react";

export type UndoEntry = { label: string; run: () => Promise<void> | void };

/** One undo stack for the plan: server actions (record, move, save outline) and local outline edits alike. */
export function useUndo(onMessage: (kind: "ok" | "warn", text: string) => void) {
  const stack = useRef<UndoEntry[]>([]);
  const [top, setTop] = useState<string | null>(null);
  const push = useCallback((e: UndoEntry) => {
    stack.current.push(e);
    if (stack.current.length > 50) stack.current.shift();
    setTop(e.label);
  }, []);
  const undo = useCallback(async () => {
    const e = stack.current.pop();
    setTop(stack.current.at(-1)?.label ?? null);
    if (!e) return;
    try {
      await e.run();
      onMessage("ok", `Undone: ${e.label}.`);
    } catch (err) {
      onMessage("warn", `Could not undo ${e.label}: ${(err as Error).message}`);
    }
  }, [onMessage]);
  return { push, undo, top };
}
