/**
 * The vertical spread of a set of finds: how far apart their reduced levels lie. Used by the Patterns scope
 * to say, per class, whether the finds projected onto one plan could come from several surfaces.
 * Pure: no database, no React.
 */

import { quantileSorted } from "d3-array";

/**
 * Default spread (metres) above which a class's finds are cautioned as possibly mixing several surfaces.
 * Common practice (a rule of thumb, not a published value): finds lying on one occupation surface usually
 * sit within a spit or two (5–10 cm each) of one another once trampling and worm sorting have moved them;
 * more than about 20 cm between the highest and the lowest suggests more than one surface. The director
 * sets the site's own value in the site settings.
 */
export const DEFAULT_LEVEL_SPREAD_CAUTION = 0.2;

export type VerticalSpread = {
  /** Finds counted. */
  n: number;
  /** Finds with a reduced level; the rest have none recorded (null, never taken as 0). */
  withLevel: number;
  /** Lowest, lower quartile, median, upper quartile and highest RL; null when no find has a level. */
  min: number | null;
  q1: number | null;
  median: number | null;
  q3: number | null;
  max: number | null;
  /** Highest minus lowest RL (m); null with fewer than two levelled finds. */
  spread: number | null;
  /** True when the spread exceeds the threshold: the class may mix several surfaces. */
  mixes: boolean;
};

/**
 * Quantile of ascending values (at least one): d3-array's quantileSorted, R's default type 7, linear between
 * order statistics (Hyndman & Fan 1996).
 */
const quantile = (sorted: number[], p: number): number => quantileSorted(sorted, p) ?? Number.NaN;

/** Rounded to the millimetre, so 41.3 − 41.1 reads 0.2 and compares equal to a threshold of 0.2. */
const mm = (v: number) => Math.round(v * 1000) / 1000;

/**
 * Summary of reduced levels; `null` entries are finds with no level, counted apart. A spread equal to the
 * threshold is not cautioned (more than the threshold is).
 */
export function verticalSpread(levels: readonly (number | null)[], threshold: number): VerticalSpread {
  if (!(threshold > 0)) throw new RangeError("The spread threshold must be more than 0 m.");
  const sorted = levels.filter((v): v is number => v !== null && Number.isFinite(v)).sort((a, b) => a - b);
  if (!sorted.length)
    return {
      n: levels.length,
      withLevel: 0,
      min: null,
      q1: null,
      median: null,
      q3: null,
      max: null,
      spread: null,
      mixes: false,
    };
  const spread = sorted.length > 1 ? mm(sorted[sorted.length - 1]! - sorted[0]!) : null;
  return {
    n: levels.length,
    withLevel: sorted.length,
    min: sorted[0]!,
    q1: quantile(sorted, 0.25),
    median: quantile(sorted, 0.5),
    q3: quantile(sorted, 0.75),
    max: sorted[sorted.length - 1]!,
    spread,
    mixes: spread !== null && spread > mm(threshold),
  };
}
