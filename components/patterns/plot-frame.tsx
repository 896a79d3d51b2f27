"use client";

import { useRef, useState, type ReactNode } from "react";
import { AfterPaint } from "./after-paint";
import { exportCsv, exportPng, exportSvg } from "./export-plot";

/** A figure with its title, caption and export buttons (SVG, PNG, CSV of the curves). Given the
 * drawing's `height`, the drawing comes a frame after the rest (after-paint.tsx). */
export function PlotFrame({
  title,
  name,
  csv,
  caption,
  height,
  children,
}: {
  title: string;
  name: string;
  csv: () => Record<string, number | string | null>[];
  caption?: ReactNode;
  height?: number;
  children: ReactNode;
}) {
  const ref = useRef<HTMLDivElement>(null);
  const [error, setError] = useState<string | null>(null);
  const guard = (fn: () => void | Promise<void>) => async () => {
    setError(null);
    try {
      await fn();
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    }
  };
  return (
    <figure className="sheet" aria-label={title}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <figcaption className="font-bold">{title}</figcaption>
        <div className="no-print flex gap-1" role="group" aria-label={`Export ${title}`}>
          <button
            type="button"
            className="btn min-h-11 px-2 text-xs"
            onClick={guard(() => exportSvg(ref.current!, name))}
          >
            SVG
          </button>
          <button
            type="button"
            className="btn min-h-11 px-2 text-xs"
            onClick={guard(() => exportPng(ref.current!, name))}
          >
            PNG
          </button>
          <button type="button" className="btn min-h-11 px-2 text-xs" onClick={guard(() => exportCsv(csv(), name))}>
            CSV
          </button>
        </div>
      </div>
      <div ref={ref} className="mt-2">
        {height === undefined ? children : <AfterPaint box={{ height }}>{children}</AfterPaint>}
      </div>
      {caption && <p className="mt-1 text-xs text-ink-soft">{caption}</p>}
      {error && (
        <p className="field-error" aria-live="polite">
          {error}
        </p>
      )}
    </figure>
  );
}
