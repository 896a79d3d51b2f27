"use client";

import { CompactToolMenu } from "./compact-tool-menu";
import type { Tool } from "./plan-canvas";

const tools: { id: Tool; label: string; key: string; hint: string }[] = [
  {
    id: "look",
    label: "Look & move",
    key: "V",
    hint: "Tap a find to select it, drag a find to move it, drag the plan to pan.",
  },
  {
    id: "place",
    label: "Place find",
    key: "F",
    hint: "Tap the plan where the find came out; a form opens for its record.",
  },
  {
    id: "outline",
    label: "Edit outline",
    key: "O",
    hint: "Drag a vertex, tap a + to add one, tap a vertex then Delete to remove it.",
  },
  {
    id: "draw",
    label: "Draw edge",
    key: "D",
    hint: "Tap each corner of the trench edge; tap the first corner to close it.",
  },
  {
    id: "hole",
    label: "Add hole",
    key: "H",
    hint: "Tap each corner of a baulk or unexcavated block; tap the first to close.",
  },
  {
    id: "extent",
    label: "Draw extent",
    key: "E",
    hint: "Pick the context in the Extent panel, tap each corner of its extent; tap the first to close and save.",
  },
  { id: "fit", label: "Fit photo", key: "P", hint: "Tap a peg on the photo, then type or tap its grid position." },
  {
    id: "section",
    label: "Section line",
    key: "S",
    hint: "Tap the section line's start, then its end; its band and figure are below the plan.",
  },
];

export function toolHint(tool: Tool) {
  return tools.find((t) => t.id === tool)?.hint ?? "";
}

export function PlanToolbar({
  tool,
  onTool,
  canEdit,
  onZoomTrench,
  onZoom,
  onUndo,
  undoLabel,
  onHelp,
}: {
  tool: Tool;
  onTool: (t: Tool) => void;
  canEdit: boolean;
  onZoomTrench: () => void;
  onZoom: (factor: number) => void;
  onUndo: () => void;
  undoLabel: string | null;
  onHelp: () => void;
}) {
  return (
    <div
      role="toolbar"
      aria-label="Plan tools"
      className="flex flex-wrap items-center gap-1 border-b border-paper-edge bg-paper px-2 py-1"
    >
      {/* Phones: the tools fold into one menu, so the plan keeps the screen (compact-tool-menu.tsx). */}
      <CompactToolMenu tools={tools} tool={tool} onTool={onTool} canEdit={canEdit} />
      {tools.map((t) => (
        <button
          key={t.id}
          type="button"
          className={`btn px-3 max-sm:hidden ${tool === t.id ? "border-ink bg-ink text-paper hover:bg-ink" : ""}`}
          aria-pressed={tool === t.id}
          disabled={!canEdit && t.id !== "look" && t.id !== "section"}
          onClick={() => onTool(t.id)}
          title={`${t.hint} (${t.key})`}
        >
          {t.label} <kbd className="rounded border border-current/40 px-1 font-mono text-xs">{t.key}</kbd>
        </button>
      ))}
      <span className="mx-1 h-8 w-px bg-paper-edge max-sm:hidden" aria-hidden="true" />
      <button type="button" className="btn px-3 max-sm:hidden" onClick={onZoomTrench}>
        Zoom to trench <kbd className="font-mono text-xs">Z</kbd>
      </button>
      <button type="button" className="btn min-w-11 px-2" onClick={() => onZoom(1.5)} aria-label="Zoom in">
        +
      </button>
      <button type="button" className="btn min-w-11 px-2" onClick={() => onZoom(1 / 1.5)} aria-label="Zoom out">
        −
      </button>
      <button
        type="button"
        className="btn px-3"
        onClick={onUndo}
        disabled={!undoLabel}
        title={undoLabel ? `Undo: ${undoLabel}` : "Nothing to undo"}
      >
        {/* One inline run of text: as separate flex items the name would read "Undo : …". */}
        <span>
          Undo<span className="max-sm:hidden">{undoLabel ? `: ${undoLabel}` : ""}</span>
        </span>{" "}
        <kbd className="font-mono text-xs max-sm:hidden">U</kbd>
      </button>
      <button type="button" className="btn ml-auto px-3 max-sm:hidden" onClick={onHelp}>
        Shortcuts <kbd className="font-mono text-xs">?</kbd>
      </button>
    </div>
  );
}

export const shortcuts: [string, string][] = [
  ["V", "Look & move: select and drag finds, pan"],
  ["F", "Place a find"],
  ["O", "Edit the outline's vertices"],
  ["D", "Draw a new trench edge"],
  ["H", "Add a hole (baulk, intrusion)"],
  ["E", "Draw a context's extent"],
  ["P", "Fit the photo to the grid"],
  ["S", "Draw a section line (its figure is below the plan)"],
  ["Z", "Zoom to the trench"],
  ["+ / −", "Zoom in / out"],
  ["Arrow keys", "Pan the plan"],
  ["Enter", "Close the ring being drawn (an extent is saved)"],
  ["Delete", "Delete the selected vertex"],
  ["U or Ctrl+Z", "Undo the last action"],
  ["Esc", "Cancel what is under way"],
  ["?", "Show or hide this list"],
];
