/**
 * Distance grids for K-type functions. The default follows spatstat 3.x (`rmax.rule("K")` and
 * `handle.r.b.args`): r max = min(short side of the bounding box / 4, √(1000 / (π λ))), with 513 values
 * from 0. The first term is Ripley's (1988) rule of thumb, the second keeps the expected number of
 * neighbours within r max near 1000.
 */
import { SpatialInputError } from "../errors";
import type { Window } from "../types";

export interface RGridOptions {
  /** Number of r values, 0 included (default 513). */
  count?: number;
  /** Override r max; must not exceed the window's diameter. */
  rmax?: number;
}

/** spatstat's default r max for K with intensity λ = n / |W|. */
export function defaultRMax(window: Window, n: number): number {
  const { bbox } = window;
  const ripley = Math.min(bbox.maxX - bbox.minX, bbox.maxY - bbox.minY) / 4;
  const lambda = n / window.area;
  return Math.min(ripley, Math.sqrt(1000 / (Math.PI * lambda)));
}

/** The default r grid for a pattern of n points in `window`. */
export function defaultRGrid(window: Window, n: number, options: RGridOptions = {}): Float64Array {
  const count = options.count ?? 513;
  if (!Number.isInteger(count) || count < 2)
    throw new SpatialInputError(`An r grid needs at least 2 values; got ${count}.`);
  if (!(n >= 1)) throw new SpatialInputError("The default r grid needs at least one point to estimate the intensity.");
  const rmax = options.rmax ?? defaultRMax(window, n);
  const r = new Float64Array(count);
  for (let k = 0; k < count; k++) r[k] = (rmax * k) / (count - 1);
  return checkRGrid(window, r);
}

/**
 * Copy a user's r grid, refusing what spatstat refuses (first value not 0, values not increasing) and
 * distances beyond the window's diameter, where no pair can exist.
 */
export function checkRGrid(window: Window, input: ArrayLike<number>): Float64Array {
  const r = Float64Array.from(input);
  if (r.length < 2) throw new SpatialInputError(`An r grid needs at least 2 values; got ${r.length}.`);
  if (r[0] !== 0) throw new SpatialInputError(`The r grid must start at 0; it starts at ${r[0]}.`);
  for (let k = 1; k < r.length; k++) {
    if (!Number.isFinite(r[k]) || !(r[k] > r[k - 1])) {
      throw new SpatialInputError(`The r grid must increase strictly; value ${k + 1} (${r[k]}) does not.`);
    }
  }
  const last = r[r.length - 1];
  if (last > window.diameter) {
    throw new SpatialInputError(
      `r = ${last} is beyond the trench window (its largest extent is ${window.diameter.toFixed(3)} m); choose a smaller r max.`,
    );
  }
  return r;
}

/**
 * Distances closer than this to a grid value are taken as equal to it (and boundary distances likewise):
 * 64 units in the last place of the largest coordinate (plus the window's diameter), above the rounding a
 * distance picks up from its coordinates (a few units) and far below any real difference between a distance
 * and a grid value. Without it a distance that is exactly a grid value (points on a lattice, a pattern in a
 * window not starting at the origin) is binned by rounding noise, and translating the window and its points
 * together, or turning them by 90°, changes K.
 */
export function snapTolerance(window: Window): number {
  const { minX, minY, maxX, maxY } = window.bbox;
  const reach = Math.max(Math.abs(minX), Math.abs(minY), Math.abs(maxX), Math.abs(maxY)) + window.diameter;
  return 64 * Number.EPSILON * reach;
}

/**
 * The thresholds a distance is compared with: d counts at r[k] when d < edges[k], edges[k] = r[k] − tol,
 * so that a distance equal to r[k] (within tol) does not count there (spatstat's `whist`: d < r[k]); at the
 * last value r max + tol, so that a distance equal to r max counts there (whist's last bin is closed).
 */
export function binEdges(r: Float64Array, tol: number): Float64Array {
  return r.map((v, k) => (k === r.length - 1 ? v + tol : v - tol));
}

/**
 * Bin index of a distance on grid r, following spatstat's `whist` on breaks (−r₁, r₀ = 0, r₁, …): the
 * smallest k with d < r[k] − tol, and the last bin for d up to r max (+ tol); r.length beyond. The value
 * at r[k] of a cumulative count is then #{d < r[k]}, distances within tol of r[k] counting as equal to it.
 */
export function createBinner(r: Float64Array, tol = 0): (d: number) => number {
  const m = r.length;
  const step = r[m - 1] / (m - 1);
  let uniform = true;
  for (let k = 0; k < m; k++) {
    if (Math.abs(r[k] - k * step) > 1e-9 * r[m - 1]) uniform = false;
  }
  const e = binEdges(r, tol);
  const last = e[m - 1];
  if (uniform) {
    return (d: number): number => {
      if (!(d < last)) return m;
      let k = Math.floor((d + tol) / step) + 1;
      if (k > m - 1) k = m - 1;
      while (k < m - 1 && e[k] <= d) k++;
      while (k > 0 && e[k - 1] > d) k--;
      return k;
    };
  }
  return (d: number): number => {
    if (!(d < last)) return m;
    let lo = 0;
    let hi = m - 1; // invariant: e[hi] > d
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (e[mid] > d) hi = mid;
      else lo = mid + 1;
    }
    return lo;
  };
}

/** A rule placing pair distances and boundary distances on an r grid. */
export interface Binning {
  /** Grid index from which a pair at distance d counts (m: nowhere). */
  bin(d: number): number;
  /** Last grid index at which a centre with boundary distance b counts in the border correction (−1: none). */
  lastCentre(b: number): number;
  /** True when a pair also needs d ≤ b_i (+ tol) to count (the generic rule); the rectangle rule has it built in. */
  needsUncensored: boolean;
  /** Distances within tol of each other or of a grid value are taken as equal (snapTolerance). */
  tol: number;
  /** Thresholds for bin(d): d counts at r[k] when d < edges[k] (for kernels that bin on their own). */
  edges: Float64Array;
}

/** True for an axis-aligned rectangle without holes (spatstat's window type "rectangle"). */
export function isAxisRectangle(window: Window): boolean {
  if (window.holes.length > 0 || window.outer.length !== 4) return false;
  const { minX, minY, maxX, maxY } = window.bbox;
  return window.outer.every(([x, y]) => (x === minX || x === maxX) && (y === minY || y === maxY));
}

function isUniform(r: Float64Array): boolean {
  const m = r.length;
  const step = r[m - 1] / (m - 1);
  for (let k = 0; k < m; k++) if (Math.abs(r[k] - k * step) > 1e-7 * step) return false;
  return true;
}

/**
 * spatstat has two discretisations and K-type estimators follow whichever spatstat 3.x would use:
 * - generic (polygons, or an uneven grid): `whist` on breaks (−r₁, 0, r₁, …), so a pair counts at r[k]
 *   when d < r[k]; a centre counts at r[k] when b ≥ r[k−1], a pair also needing d ≤ b_i (`Kount`);
 * - rectangle with an evenly spaced grid (`Krect.engine`): a pair counts at r[l] when d ≤ r[l] (index
 *   ⌈d/Δr⌉) and d < r max; a centre counts at r[l] when r[l] < b (index < ⌈b/Δr⌉).
 * The two differ only where distances fall exactly on grid values. `rule = "generic"` forces the first
 * (spatstat's Kcross and Kdot always use it).
 */
export function createBinning(window: Window, r: Float64Array, rule: "auto" | "generic" = "auto"): Binning {
  const m = r.length;
  const tol = snapTolerance(window);
  if (rule === "auto" && isAxisRectangle(window) && isUniform(r)) {
    const step = r[m - 1] / (m - 1);
    const rmax = r[m - 1];
    // d counts at r[l] when d ≤ r[l] (+ tol) and d < r max (− tol); a centre at r[l] when r[l] < b (− tol)
    return {
      bin: (d) => (d < rmax - tol ? Math.max(0, Math.ceil((d - tol) / step)) : m),
      lastCentre: (b) => Math.min(Math.ceil((b - tol) / step) - 1, m - 1),
      needsUncensored: false,
      tol,
      edges: r.map((v, l) => (l === m - 1 ? rmax - tol : v + tol)),
    };
  }
  const bin = createBinner(r, tol);
  return { bin, lastCentre: (b) => Math.min(bin(b), m - 1), needsUncensored: true, tol, edges: binEdges(r, tol) };
}
