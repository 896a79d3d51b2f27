"use client";

import { formatMetres, scaleBar } from "@/lib/geometry/plan-view";
import { useCallback, useRef, useSyncExternalStore, type RefObject } from "react";
import type { Pt } from "@/lib/geometry/outline-edit";
import type { ViewStore } from "./view-store";

/**
 * Scale bar, north arrow and the pointer's grid position, drawn over the canvas in HTML for crisp text.
 * Only the scale matters to the bar, so a pan does not re-render it; the pointer text is written by the
 * screen straight into `pointerRef` (see usePointerReadout).
 */
export function PlanOverlay({
  viewStore,
  pointerRef,
}: {
  viewStore: ViewStore;
  pointerRef: RefObject<HTMLDivElement | null>;
}) {
  const scaleNow = () => viewStore.get()?.scale ?? 1;
  const scale = useSyncExternalStore(viewStore.subscribe, scaleNow, scaleNow);
  const bar = scaleBar({ scale, ox: 0, oy: 0 }, 140);
  return (
    <>
      <div
        className="pointer-events-none absolute bottom-3 left-3 rounded border border-ink/40 bg-paper/95 px-3 py-2 text-ink shadow"
        aria-label="Scale bar"
      >
        <div className="flex h-3 border-x-2 border-b-2 border-ink" style={{ width: bar.px }}>
          <div className="h-full w-1/2 bg-ink" />
        </div>
        <p className="num mt-1 text-sm font-semibold" data-testid="scale-bar">
          {formatMetres(bar.metres)}
        </p>
      </div>
      <div
        className="pointer-events-none absolute right-3 top-3 flex flex-col items-center rounded border border-ink/40 bg-paper/95 px-2 py-1 shadow"
        aria-label="Grid north is up"
      >
        <svg width="28" height="34" viewBox="0 0 28 34" aria-hidden="true">
          <path d="M14 2 L24 30 L14 23 L4 30 Z" fill="#1b130c" />
          <path d="M14 2 L14 23 L4 30 Z" fill="#f7f2e8" stroke="#1b130c" strokeWidth="1.2" />
        </svg>
        <span className="text-xs font-bold">N (grid)</span>
      </div>
      <div
        ref={pointerRef}
        className="num pointer-events-none absolute bottom-3 right-3 rounded border border-ink/40 bg-paper/95 px-3 py-2 text-sm font-semibold shadow"
        aria-live="off"
        data-testid="pointer-coords"
      >
        x — · y —
      </div>
    </>
  );
}

/**
 * The pointer's grid position, written straight into the overlay: a state update per pointer move would re-render the
 * whole screen.
 */
export function usePointerReadout() {
  const pointerRef = useRef<HTMLDivElement>(null);
  const setPointer = useCallback((p: Pt | null) => {
    if (pointerRef.current)
      pointerRef.current.textContent = p ? `x ${p[0].toFixed(3)} m · y ${p[1].toFixed(3)} m` : "x — · y —";
  }, []);
  return { pointerRef, setPointer };
}
