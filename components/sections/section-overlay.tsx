"use client";

import { useSyncExternalStore } from "react";
import type { ViewStore } from "@/components/plan/view-store";
import { useSectionDraft } from "./section-draft";

/** The section line and its band drawn over the plan (in SVG above the canvas; taps pass through). */
export function SectionOverlay({ viewStore }: { viewStore: ViewStore }) {
  const view = useSyncExternalStore(viewStore.subscribe, viewStore.get, viewStore.get);
  const { start, end, halfWidth } = useSectionDraft();
  if (!view || !start) return null;
  const S = (p: readonly [number, number]) => [view.ox + p[0] * view.scale, view.oy - p[1] * view.scale] as const;
  const [ax, ay] = S(start);
  let band: string | null = null;
  let bx = ax,
    by = ay;
  if (end) {
    [bx, by] = S(end);
    const len = Math.hypot(end[0] - start[0], end[1] - start[1]);
    if (len > 0) {
      const nx = (-(end[1] - start[1]) / len) * halfWidth;
      const ny = ((end[0] - start[0]) / len) * halfWidth;
      band = [
        S([start[0] + nx, start[1] + ny]),
        S([end[0] + nx, end[1] + ny]),
        S([end[0] - nx, end[1] - ny]),
        S([start[0] - nx, start[1] - ny]),
      ]
        .map(([x, y]) => `${x.toFixed(1)},${y.toFixed(1)}`)
        .join(" ");
    }
  }
  return (
    <svg
      className="pointer-events-none absolute inset-0 h-full w-full"
      aria-label="Section line on the plan"
      data-testid="section-overlay"
    >
      {band && <polygon points={band} fill="#d55e00" fillOpacity={0.12} stroke="#d55e00" strokeDasharray="4 3" />}
      {end && <line x1={ax} y1={ay} x2={bx} y2={by} stroke="#d55e00" strokeWidth={2.5} />}
      <circle cx={ax} cy={ay} r={5} fill="#d55e00" />
      <text x={ax + 7} y={ay - 7} fontWeight="bold" fill="#7a2e00">
        A
      </text>
      {end && (
        <>
          <circle cx={bx} cy={by} r={5} fill="#d55e00" />
          <text x={bx + 7} y={by - 7} fontWeight="bold" fill="#7a2e00">
            B
          </text>
        </>
      )}
    </svg>
  );
}
