"use client";

import { useEffect } from "react";
import type { Tool } from "./plan-canvas";

/** What the plan's keys do; each is called with the screen's state of the moment. */
export type PlanKeyActions = {
  canEdit: boolean;
  tool: Tool;
  /** False before the plan has a view: then only the tool keys and undo (Ctrl+Z) answer. */
  hasView: () => boolean;
  undo: () => Promise<void>;
  chooseTool: (t: Tool) => void;
  zoomToTrench: () => void;
  zoomBy: (factor: number) => void;
  pan: (dx: number, dy: number) => void;
  toggleHelp: () => void;
  /** Enter: close the ring being drawn (outline, hole or extent). */
  finishRing: () => void;
  /** Delete or Backspace with the outline tool. */
  deleteVertex: () => void;
  /** Escape: drop the ring being drawn, the find being placed, the chosen vertex, a refusal mark. */
  escape: () => void;
};

const toolKeys: Record<string, Tool> = {
  v: "look",
  f: "place",
  o: "outline",
  d: "draw",
  h: "hole",
  e: "extent",
  p: "fit",
  s: "section",
};
const panStep = 60;

/** The plan's keyboard shortcuts (the Shortcuts panel lists them); keys typed into a field are left alone. */
export function usePlanKeys(actions: PlanKeyActions) {
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const el = e.target as HTMLElement;
      if (el.closest("input, textarea, select")) return;
      const k = e.key;
      if ((e.ctrlKey || e.metaKey) && k.toLowerCase() === "z") return (e.preventDefault(), void actions.undo());
      if (e.ctrlKey || e.metaKey || e.altKey) return;
      const tool = toolKeys[k.toLowerCase()];
      if (tool && (actions.canEdit || tool === "look" || tool === "section")) return actions.chooseTool(tool);
      if (!actions.hasView()) return;
      if (k === "z" || k === "Z") actions.zoomToTrench();
      else if (k === "+" || k === "=") actions.zoomBy(1.5);
      else if (k === "-" || k === "_") actions.zoomBy(1 / 1.5);
      else if (k.startsWith("Arrow")) {
        e.preventDefault();
        actions.pan(
          k === "ArrowLeft" ? panStep : k === "ArrowRight" ? -panStep : 0,
          k === "ArrowUp" ? panStep : k === "ArrowDown" ? -panStep : 0,
        );
      } else if (k === "u" || k === "U") void actions.undo();
      else if (k === "?") actions.toggleHelp();
      else if (k === "Enter") actions.finishRing();
      else if ((k === "Delete" || k === "Backspace") && actions.tool === "outline") actions.deleteVertex();
      else if (k === "Escape") actions.escape();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  });
}
