"use client";

import { useSyncExternalStore } from "react";
import { FIELD_MODE_COOKIE } from "@/lib/field-mode";

const listeners = new Set<() => void>();
const subscribe = (l: () => void) => {
  listeners.add(l);
  return () => listeners.delete(l);
};
const isOn = () => document.documentElement.dataset.fieldMode === "on";

/**
 * Field mode: black on white, heavier rules, for a screen read in sunlight. Kept per device in a cookie
 * (a year), switched here, applied by app/globals.css to `html[data-field-mode="on"]`.
 */
export function FieldModeButton() {
  const on = useSyncExternalStore(subscribe, isOn, () => false);
  const toggle = () => {
    const next = on ? "off" : "on";
    document.documentElement.dataset.fieldMode = next;
    document.cookie = `${FIELD_MODE_COOKIE}=${next}; path=/; max-age=31536000; samesite=lax`;
    listeners.forEach((l) => l());
  };
  return (
    <button type="button" className="btn" aria-pressed={on} onClick={toggle}>
      Field mode
    </button>
  );
}
