import type { View } from "@/lib/geometry/plan-view";

/**
 * The plan's live view, kept outside React state. A pan or zoom changes it many times a second; the
 * canvas redraws itself from it and the overlay re-renders only when the scale changes, so the plan
 * screen with its panels is never re-rendered by a gesture. Event handlers read it when they run.
 */
export type ViewStore = {
  get: () => View | null;
  set: (v: View) => void;
  subscribe: (listener: () => void) => () => void;
};

export function createViewStore(): ViewStore {
  let view: View | null = null;
  const listeners = new Set<() => void>();
  return {
    get: () => view,
    set: (v) => {
      if (!Number.isFinite(v.scale) || !Number.isFinite(v.ox) || !Number.isFinite(v.oy) || v.scale <= 0)
        throw new Error(`not a plan view: ${JSON.stringify(v)}`);
      if (view && view.scale === v.scale && view.ox === v.ox && view.oy === v.oy) return;
      view = v;
      for (const l of listeners) l();
    },
    subscribe: (listener) => {
      listeners.add(listener);
      return () => void listeners.delete(listener);
    },
  };
}
