"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import type { Pt, Rings } from "@/lib/geometry/outline-edit";
import { boundsOf, fitBounds, gridLines, toScreen, zoomAt } from "@/lib/geometry/plan-view";
import type { FindRow } from "./rows";
import { createViewStore } from "./view-store";

/**
 * The plan's frame: the drawing box and its size, the view (kept in a store, not in state: a pan or zoom
 * must not re-render the panels and the finds list), and the moves made on it by buttons and keys.
 */
export function usePlanView(rings: Rings, savedRings: Rings) {
  const box = useRef<HTMLDivElement>(null);
  const [size, setSize] = useState({ width: 0, height: 0 });
  const [viewStore] = useState(createViewStore);
  const [hasView, setHasView] = useState(false);

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const ro = new ResizeObserver(([e]) => {
      if (e) setSize({ width: Math.floor(e.contentRect.width), height: Math.floor(e.contentRect.height) });
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  const trenchBounds = useCallback(() => {
    const pts = (rings[0]?.length ? rings : savedRings).flat();
    if (!pts.length) return { minX: 0, minY: 0, maxX: 10, maxY: 10 };
    return boundsOf(pts);
  }, [rings, savedRings]);
  const zoomToTrench = useCallback(() => {
    if (!size.width) return;
    viewStore.set(fitBounds(trenchBounds(), size.width, size.height));
    setHasView(true);
  }, [size, trenchBounds, viewStore]);
  useEffect(() => {
    if (!viewStore.get() && size.width > 0) zoomToTrench();
  }, [size.width, viewStore, zoomToTrench]);

  /** Zooms about the middle of the plan by `factor`. */
  const zoomBy = (factor: number) => {
    const view = viewStore.get();
    if (view) viewStore.set(zoomAt(view, factor, size.width / 2, size.height / 2));
  };

  /** Moves the view by whole screen pixels (the arrow keys). */
  const pan = (dx: number, dy: number) => {
    const view = viewStore.get();
    if (view) viewStore.set({ ...view, ox: view.ox + dx, oy: view.oy + dy });
  };

  /** A tapped point, snapped to the nearest grid crossing when that is within 14 screen pixels. */
  const snapToGrid = (p: Pt): Pt => {
    const view = viewStore.get();
    if (!view) return p;
    const { step } = gridLines(view, size.width, size.height);
    const q: Pt = [Math.round(p[0] / step) * step, Math.round(p[1] / step) * step];
    const [ax, ay] = toScreen(view, ...p);
    const [bx, by] = toScreen(view, ...q);
    return Math.hypot(ax - bx, ay - by) <= 14 ? q : p;
  };

  /** Screen distance between two grid points, or null before the first view. */
  const screenDistance = (a: Pt, b: Pt): number | null => {
    const view = viewStore.get();
    if (!view) return null;
    const [ax, ay] = toScreen(view, ...a);
    const [bx, by] = toScreen(view, ...b);
    return Math.hypot(ax - bx, ay - by);
  };

  // Read when a find is picked from the list, so the stable callback needs no size in its dependencies.
  const latestSize = useRef(size);
  latestSize.current = size;
  /** Brings a find into sight when it lies outside the plan. */
  const bringIntoView = useCallback(
    (f: FindRow) => {
      const [v, sz] = [viewStore.get(), latestSize.current];
      if (!v) return;
      const [sx, sy] = toScreen(v, f.x, f.y);
      if (sx < 0 || sy < 0 || sx > sz.width || sy > sz.height)
        viewStore.set({ ...v, ox: v.ox + sz.width / 2 - sx, oy: v.oy + sz.height / 2 - sy });
    },
    [viewStore],
  );

  return { box, size, viewStore, hasView, zoomToTrench, zoomBy, pan, snapToGrid, screenDistance, bringIntoView };
}
