import type { Window } from "@/lib/spatial";

/**
 * Default largest distance: a quarter of the trench's short side (of its bounding box). Ripley's (1988)
 * rule of thumb, the first term of spatstat's default; Loamwork does not apply spatstat's second term,
 * which shrinks r max as the class grows dense, so that every class in one run shares one grid.
 */
export function defaultRmax(window: Window): number {
  const { bbox } = window;
  return Math.min(bbox.maxX - bbox.minX, bbox.maxY - bbox.minY) / 4;
}

/** Number of r values on the grid of every curve (0 included). */
export const R_COUNT = 129;

export const DEFAULT_PARAMS = { correction: "isotropic", nsim: 999, level: 0.05 } as const;

/** Round a distance for display and for a stable default (cm precision). */
export const roundMetres = (v: number) => Math.round(v * 100) / 100;
