"use client";

import type { Tool } from "./plan-canvas";

/**
 * The plan's tools as one menu on a phone (under 640 px wide): the row of tool buttons would take three
 * lines of a 390 px screen. A native select opens the phone's own picker, and is 44 px high.
 */
export function CompactToolMenu({
  tools,
  tool,
  onTool,
  canEdit,
}: {
  tools: { id: Tool; label: string }[];
  tool: Tool;
  onTool: (t: Tool) => void;
  canEdit: boolean;
}) {
  return (
    <label className="flex min-w-0 flex-1 items-center gap-2 sm:hidden">
      <span className="text-sm font-semibold">Tool</span>
      <select
        className="field min-w-0 flex-1 py-1"
        value={tool}
        onChange={(e) => onTool(e.target.value as Tool)}
        aria-label="Plan tool"
      >
        {tools.map((t) => (
          <option key={t.id} value={t.id} disabled={!canEdit && t.id !== "look"}>
            {t.label}
          </option>
        ))}
      </select>
    </label>
  );
}
