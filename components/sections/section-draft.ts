"use client";

import { useSyncExternalStore } from "react";

type Pt = readonly [number, number];

/** The section line being drawn: the plan's taps set its ends, the section panel its band and numbers. */
export type SectionDraft = { start: Pt | null; end: Pt | null; halfWidth: number };

let draft: SectionDraft = { start: null, end: null, halfWidth: 0.5 };
const listeners = new Set<() => void>();

export const sectionDraft = {
  get: () => draft,
  set(patch: Partial<SectionDraft>) {
    draft = { ...draft, ...patch };
    for (const l of listeners) l();
  },
  /** A tap on the plan with the section tool: the first sets the start, the second the end, a third starts again. */
  tap(p: Pt) {
    const at: Pt = [Math.round(p[0] * 1000) / 1000, Math.round(p[1] * 1000) / 1000];
    if (!draft.start || draft.end) sectionDraft.set({ start: at, end: null });
    else sectionDraft.set({ end: at });
  },
  subscribe(listener: () => void) {
    listeners.add(listener);
    return () => void listeners.delete(listener);
  },
};

export function useSectionDraft(): SectionDraft {
  return useSyncExternalStore(sectionDraft.subscribe, sectionDraft.get, sectionDraft.get);
}
