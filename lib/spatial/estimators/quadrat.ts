/**
 * Quadrat counts in the trench (Greig-Smith 1952, Quantitative Plant Ecology; Pearson's X², with Cochran's
 * 1954 rule that expected counts below 5 make the χ² approximation doubtful). Following spatstat 3.x
 * `quadrat.test`: the bounding box is split into nx × ny equal cells, each clipped to W (exact clipped
 * areas), cells of zero area dropped, expected counts E_c = n·|cell ∩ W|/|W|, df = cells − 1, and by
 * default the two-sided p = 2·min(P(χ² > X²), P(χ² < X²)). Cells are listed top row first, as spatstat
 * does; a find on a cell line belongs to the cell below/left of it, except on the first line (R's `cut`
 * with include.lowest).
 */
import jStat from "../random/jstat-typed";
import { clippedRingArea } from "../geometry/ring";
import { checkPattern } from "../geometry/pattern";
import { SpatialInputError } from "../errors";
import type { Alternative } from "./clark-evans";
import { snapTolerance } from "./r-grid";
import type { PointsInput, Window } from "../types";

export interface QuadratCell {
  /** 1-based, row 1 at the top (largest y). */
  row: number;
  col: number;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
  /** |cell ∩ W| */
  area: number;
  /** True when the cell lies wholly inside W (its area is the full cell's). */
  whole: boolean;
}

export interface QuadratLayout {
  nx: number;
  ny: number;
  xbreaks: Float64Array;
  ybreaks: Float64Array;
  /** Kept cells (positive clipped area), top row first. */
  cells: QuadratCell[];
  /** Index into `cells` of grid cell (ix, iy) counted from the bottom left, −1 if dropped. */
  lookup: Int32Array;
  area: number;
  /** A find within this of a cell line counts as on it (rounding; see r-grid.ts snapTolerance). */
  tol: number;
}

function breaks(lo: number, hi: number, k: number): Float64Array {
  const out = new Float64Array(k + 1);
  for (let i = 0; i <= k; i++) out[i] = lo + (i * (hi - lo)) / k;
  out[k] = hi;
  return out;
}

/** Interval of v among breaks b: (b[i], b[i+1]], the first one closed; v within tol of a break is on it. */
function interval(b: Float64Array, v: number, tol: number): number {
  let i = 0;
  while (i < b.length - 2 && v > b[i + 1] + tol) i++;
  return i;
}

export function createQuadratLayout(window: Window, nx = 5, ny = nx): QuadratLayout {
  for (const [name, k] of [
    ["nx", nx],
    ["ny", ny],
  ] as const) {
    if (!Number.isInteger(k) || k < 1)
      throw new SpatialInputError(`The quadrat grid needs a whole number of cells ≥ 1; ${name} = ${k}.`);
  }
  const { bbox } = window;
  const xbreaks = breaks(bbox.minX, bbox.maxX, nx);
  const ybreaks = breaks(bbox.minY, bbox.maxY, ny);
  const rings = [window.outer, ...window.holes];
  const lookup = new Int32Array(nx * ny).fill(-1);
  const cells: QuadratCell[] = [];
  for (let iy = ny - 1; iy >= 0; iy--) {
    for (let ix = 0; ix < nx; ix++) {
      const [x0, x1, y0, y1] = [xbreaks[ix], xbreaks[ix + 1], ybreaks[iy], ybreaks[iy + 1]];
      // signed areas: the outer ring counts positive, holes (clockwise) negative
      let area = 0;
      for (const ring of rings) area += clippedRingArea(ring, x0, y0, x1, y1);
      if (!(area > 1e-12 * window.area)) continue;
      const full = (x1 - x0) * (y1 - y0);
      lookup[iy * nx + ix] = cells.length;
      cells.push({ row: ny - iy, col: ix + 1, x0, x1, y0, y1, area, whole: Math.abs(area - full) <= 1e-9 * full });
    }
  }
  return { nx, ny, xbreaks, ybreaks, cells, lookup, area: window.area, tol: snapTolerance(window) };
}

/** Counts per kept cell of finds (x, y), assumed inside W. */
export function quadratCounts(
  layout: QuadratLayout,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  n = x.length,
): Float64Array {
  const counts = new Float64Array(layout.cells.length);
  for (let k = 0; k < n; k++) {
    const c =
      layout.lookup[
        interval(layout.ybreaks, y[k], layout.tol) * layout.nx + interval(layout.xbreaks, x[k], layout.tol)
      ];
    if (c < 0) throw new SpatialInputError(`Find ${k + 1} falls in a quadrat with no area inside the trench.`);
    counts[c]++;
  }
  return counts;
}

/** Pearson's X² = Σ (O − E)² / E with E ∝ clipped area. */
export function quadratChiSquare(layout: QuadratLayout, counts: Float64Array, n: number): number {
  let x2 = 0;
  for (let c = 0; c < counts.length; c++) {
    const e = (n * layout.cells[c].area) / layout.area;
    x2 += ((counts[c] - e) * (counts[c] - e)) / e;
  }
  return x2;
}

export interface QuadratOptions {
  nx?: number;
  ny?: number;
  alternative?: Alternative;
  label?: string;
}

export interface QuadratResult {
  layout: QuadratLayout;
  observed: Float64Array;
  expected: Float64Array;
  X2: number;
  df: number;
  alternative: Alternative;
  p: number;
  /** P(χ² > X²): small for over-dispersed (clustered) counts. */
  pClustered: number;
  /** P(χ² < X²): small for too-even counts. */
  pRegular: number;
  /** Sample variance / mean of the counts of all kept cells (unequal clipped areas inflate it). */
  varianceMeanRatio: number;
  /** The same over whole cells only, the classic index of dispersion; null with fewer than 2 whole cells. */
  wholeCellVarianceMeanRatio: number | null;
  /** Some expected count is below 5: prefer the Monte Carlo p (Cochran 1954). */
  smallExpected: boolean;
  minExpected: number;
}

function varianceMean(values: number[]): number | null {
  if (values.length < 2) return null;
  const mean = values.reduce((s, v) => s + v, 0) / values.length;
  if (mean === 0) return null;
  const v = values.reduce((s, x) => s + (x - mean) ** 2, 0) / (values.length - 1);
  return v / mean;
}

export function quadratTest(window: Window, points: PointsInput, options: QuadratOptions = {}): QuadratResult {
  const alternative = options.alternative ?? "two-sided";
  const p = checkPattern(window, points, { label: options.label });
  const n = p.x.length;
  const layout = createQuadratLayout(window, options.nx ?? 5, options.ny ?? options.nx ?? 5);
  const cellCount = layout.cells.length;
  if (cellCount < 2)
    throw new SpatialInputError("The quadrat test needs at least 2 cells inside the trench; use a finer grid.");
  const observed = quadratCounts(layout, p.x, p.y);
  const expected = Float64Array.from(layout.cells, (c) => (n * c.area) / window.area);
  const X2 = quadratChiSquare(layout, observed, n);
  const df = cellCount - 1;
  const pRegular = jStat.chisquare.cdf(X2, df);
  const pClustered = Math.max(0, 1 - pRegular);
  const pTwo = Math.min(1, 2 * Math.min(pClustered, pRegular));
  const minExpected = Math.min(...expected);
  const vmr = varianceMean(Array.from(observed)) ?? 0;
  const whole = layout.cells.flatMap((c, k) => (c.whole ? [observed[k]] : []));
  return {
    layout,
    observed,
    expected,
    X2,
    df,
    alternative,
    p: alternative === "two-sided" ? pTwo : alternative === "clustered" ? pClustered : pRegular,
    pClustered,
    pRegular,
    varianceMeanRatio: vmr,
    wholeCellVarianceMeanRatio: varianceMean(whole),
    smallExpected: minExpected < 5,
    minExpected,
  };
}
