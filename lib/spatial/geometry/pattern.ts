/** Checking a point pattern against its window before any estimator sees it. */
import { SpatialInputError } from "../errors";
import type { Points, PointsInput, Window } from "../types";

export interface PatternCheck {
  /** Name used in messages, e.g. "class A" or "the finds". */
  label?: string;
  /** Smallest number of points the estimator needs (default 2). */
  minPoints?: number;
}

/**
 * Copy a pattern into Float64Arrays and refuse what no estimator can use: unequal or non-finite
 * coordinates, too few points, every point at one place, or a point outside the trench.
 */
export function checkPattern(window: Window, input: PointsInput, options: PatternCheck = {}): Points {
  const label = options.label ?? "the finds";
  const minPoints = options.minPoints ?? 2;
  if (!input || input.x == null || input.y == null)
    throw new SpatialInputError(`No coordinates were given for ${label}.`);
  const n = input.x.length;
  if (input.y.length !== n) {
    throw new SpatialInputError(`${label}: ${n} x coordinates but ${input.y.length} y coordinates.`);
  }
  if (n === 0) throw new SpatialInputError(`${label} has no points (an empty class cannot be tested).`);
  if (n < minPoints) throw new SpatialInputError(`${label} has ${n} point(s); this test needs at least ${minPoints}.`);
  const x = Float64Array.from(input.x);
  const y = Float64Array.from(input.y);
  let allSame = true;
  for (let k = 0; k < n; k++) {
    if (!Number.isFinite(x[k]) || !Number.isFinite(y[k])) {
      throw new SpatialInputError(`Point ${k + 1} of ${label} has a coordinate that is not a finite number.`);
    }
    if (!window.contains(x[k], y[k])) {
      throw new SpatialInputError(
        `Point ${k + 1} of ${label} (${x[k].toFixed(3)}, ${y[k].toFixed(3)}) lies outside the trench window.`,
      );
    }
    if (x[k] !== x[0] || y[k] !== y[0]) allSame = false;
  }
  if (allSame && n > 1) throw new SpatialInputError(`All ${n} points of ${label} are at the same place.`);
  return { x, y };
}
