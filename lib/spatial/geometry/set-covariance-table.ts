/**
 * The window's set covariance g(v) = |W ∩ (W + v)| prepared once per run for every displacement with
 * |v_x|, |v_y| ≤ reach, so that the translation weight |W| / g(v) of a pair (Ohser 1983) costs a table look-up
 * and one quadratic instead of a sum over every pair of edges.
 *
 * Exact, not an interpolation. edge-translation.ts writes g(v) = Σ_{e,f} σ_e σ_f A_ef(v), where A_ef is the
 * area of the trapezoid under edge e of W meeting the trapezoid under edge f of W + v. Each A_ef is a
 * quadratic polynomial in v on every region where its case does not change (which end bounds the common
 * x-interval on each side, whether that interval is empty, which line is lower at either end); the case
 * changes only on straight lines in v-space. The v-square is cut into a grid of cells by halving: in a cell
 * that no such line of (e, f) crosses, A_ef is one polynomial there and is added to the cell's polynomial;
 * the pairs (e, f) whose case does change inside a cell (few: only lines through the cell) are kept in the
 * cell's list and computed as edge-translation.ts computes them. g(v) in a cell is then the cell's
 * polynomial plus its list: the same sum, regrouped, so it differs from edge-translation.ts by rounding only.
 *
 * g is even (g(v) = g(−v)), so only v_y ≥ 0 is prepared, where the common baseline of the trapezoids is
 * y = 0 (coordinates relative to the bounding-box corner).
 */
import { setCovariance, trapezoidEdges, type TrapezoidEdges } from "./edge-translation";
import type { PairList } from "./neighbours";
import type { Window } from "../types";

export interface SetCovarianceTable {
  /** Displacements with |v_x| ≤ reach and |v_y| ≤ reach are looked up; others are computed directly. */
  readonly reach: number;
  /** |W ∩ (W + (dx, dy))|. */
  at(dx: number, dy: number): number;
  /**
   * Translation weights |W| / g(x_j − x_i) of every pair, floored as translationPairWeights does (the same
   * values to rounding).
   */
  pairWeights(
    ax: ArrayLike<number>,
    ay: ArrayLike<number>,
    bx: ArrayLike<number>,
    by: ArrayLike<number>,
    pairs: PairList,
    out?: Float64Array,
  ): Float64Array;
  /** Cells of the grid, and edge pairs kept in the cells' lists (all cells together). */
  readonly cells: number;
  readonly listed: number;
  /**
   * The grid itself, for kernels that look up inline: cell c = iy·gx + ix covers v_x ∈ −reach + [ix, ix+1]·h,
   * v_y ∈ [iy, iy+1]·h (h = reach / gy); cell[8c .. 8c+5] is its polynomial in (v_x, v_y) (terms 1, x, y, x²,
   * xy, y²), cell[8c+6] and cell[8c+7] the first and end index of its listed pairs in `listE`, `listF`.
   */
  readonly cell: Float64Array;
  readonly gx: number;
  readonly gy: number;
  readonly invH: number;
  /** Σ of the listed pairs' terms of cell c at v (v_y ≥ 0, within the cell). */
  listedTerms(c: number, dx: number, dy: number): number;
  /** The listed pairs of all cells: edge listE[k] of W with edge listF[k] of W + v (indices into `trapezoids`). */
  readonly listE: Int32Array;
  readonly listF: Int32Array;
  readonly trapezoids: TrapezoidEdges;
}

export interface SetCovarianceTableOptions {
  /** Halvings of the v-square (the grid is 2^depth rows by 2^(depth+1) columns); default 7. */
  depth?: number;
  /**
   * Bound on the preparation's work, in edge-pair tests; beyond it (windows with very many edges) the table
   * is not built and `createSetCovarianceTable` returns null. Default 2·10^7.
   */
  budget?: number;
}

/** poly += s·p·q for linear forms p = p0 + p1·v_x + p2·v_y and q (poly: terms 1, x, y, x², xy, y²). */
function addProduct(
  poly: Float64Array,
  s: number,
  p0: number,
  p1: number,
  p2: number,
  q0: number,
  q1: number,
  q2: number,
): void {
  poly[0] += s * p0 * q0;
  poly[1] += s * (p0 * q1 + p1 * q0);
  poly[2] += s * (p0 * q2 + p2 * q0);
  poly[3] += s * p1 * q1;
  poly[4] += s * (p1 * q2 + p2 * q1);
  poly[5] += s * p2 * q2;
}

export function createSetCovarianceTable(
  window: Window,
  reach: number,
  options: SetCovarianceTableOptions = {},
): SetCovarianceTable | null {
  const t = trapezoidEdges(window);
  const { count: E, x0, x1, y0, slope, sigma } = t;
  const depth = options.depth ?? 7;
  let budget = options.budget ?? 2e7;
  const gy = 1 << depth,
    gx = 2 * gy;
  const h = reach / gy;
  const invH = 1 / h;
  const cells = gx * gy;
  const cell = new Float64Array(8 * cells);
  const lists: (Int32Array | null)[] = new Array<Int32Array | null>(cells).fill(null);

  /**
   * Add the polynomial of (e, f) on the box to poly when its case is fixed there; return false when the
   * case changes inside the box (then the pair is kept for the children). A pair that is zero throughout
   * the box returns true and adds nothing.
   */
  const classify = (e: number, f: number, xlo: number, xhi: number, ylo: number, yhi: number, poly: Float64Array) => {
    const ea = x0[e],
      eb = x1[e],
      ey = y0[e],
      es = slope[e];
    const fa = x0[f],
      fb = x1[f],
      fy = y0[f],
      fs = slope[f];
    // the common x-interval [max(ea, fa + v_x), min(eb, fb + v_x)] is non-empty for ea − fb < v_x < eb − fa
    const lo = ea - fb,
      hi = eb - fa;
    if (xhi <= lo || xlo >= hi) return true;
    if (xlo < lo || xhi > hi) return false;
    const bl = ea - fa, // left end: ea for v_x ≤ bl, fa + v_x beyond
      br = eb - fb; // right end: fb + v_x for v_x ≤ br, eb beyond
    if ((xlo < bl && bl < xhi) || (xlo < br && br < xhi)) return false;
    // the ends as linear forms in v: xl = xl0 + xl1·v_x, xr = xr0 + xr1·v_x
    const leftE = xhi <= bl,
      rightE = xlo >= br;
    const xl0 = leftE ? ea : fa,
      xl1 = leftE ? 0 : 1;
    const xr0 = rightE ? eb : fb,
      xr1 = rightE ? 0 : 1;
    // e's line and f's shifted line at either end: el = el0 + el1·v_x, gl = gl0 + gl1·v_x + v_y, …
    const el0 = ey + es * (xl0 - ea),
      el1 = es * xl1;
    const er0 = ey + es * (xr0 - ea),
      er1 = es * xr1;
    const gl0 = fy + fs * (xl0 - fa),
      gl1 = fs * (xl1 - 1);
    const gr0 = fy + fs * (xr0 - fa),
      gr1 = fs * (xr1 - 1);
    // dl = el − gl = dl0 + dl1·v_x − v_y, and dr alike: their extremes over the box are at its corners
    const dl0 = el0 - gl0,
      dl1 = el1 - gl1;
    const dr0 = er0 - gr0,
      dr1 = er1 - gr1;
    const dlMin = dl0 + dl1 * (dl1 > 0 ? xlo : xhi) - yhi,
      dlMax = dl0 + dl1 * (dl1 > 0 ? xhi : xlo) - ylo;
    const drMin = dr0 + dr1 * (dr1 > 0 ? xlo : xhi) - yhi,
      drMax = dr0 + dr1 * (dr1 > 0 ? xhi : xlo) - ylo;
    if ((dlMin < 0 && dlMax > 0) || (drMin < 0 && drMax > 0)) return false;
    const half = (sigma[e] * sigma[f]) / 2;
    if (dlMax <= 0 && drMax <= 0) {
      // e's line is the lower one throughout: width · (el + er) / 2
      addProduct(poly, half, xr0 - xl0, xr1 - xl1, 0, el0 + er0, el1 + er1, 0);
    } else if (dlMin >= 0 && drMin >= 0) {
      addProduct(poly, half, xr0 - xl0, xr1 - xl1, 0, gl0 + gr0, gl1 + gr1, 2);
    } else {
      // the lines cross inside the interval, at xc = xl − dl / (es − fs) (es ≠ fs here: parallel lines
      // have dl ≡ dr, which the cases above take)
      const k = 1 / (es - fs);
      const xc0 = xl0 - dl0 * k,
        xc1 = xl1 - dl1 * k,
        xc2 = k;
      const yc0 = ey + es * (xc0 - ea),
        yc1 = es * xc1,
        yc2 = es * xc2;
      const lowLe = dlMax <= 0,
        lowRe = drMax <= 0;
      const ll0 = lowLe ? el0 : gl0,
        ll1 = lowLe ? el1 : gl1,
        ll2 = lowLe ? 0 : 1;
      const lr0 = lowRe ? er0 : gr0,
        lr1 = lowRe ? er1 : gr1,
        lr2 = lowRe ? 0 : 1;
      addProduct(poly, half, xc0 - xl0, xc1 - xl1, xc2, ll0 + yc0, ll1 + yc1, ll2 + yc2);
      addProduct(poly, half, xr0 - xc0, xr1 - xc1, -xc2, lr0 + yc0, lr1 + yc1, lr2 + yc2);
    }
    return true;
  };

  let listed = 0;
  let overBudget = false;
  const split = (ix: number, iy: number, size: number, pairs: Int32Array, poly: Float64Array): void => {
    if (overBudget) return;
    budget -= pairs.length / 2;
    if (budget < 0) {
      overBudget = true;
      return;
    }
    const xlo = -reach + ix * h,
      xhi = -reach + (ix + size) * h,
      ylo = iy * h,
      yhi = (iy + size) * h;
    const own = poly.slice();
    const kept: number[] = [];
    for (let k = 0; k < pairs.length; k += 2) {
      if (!classify(pairs[k], pairs[k + 1], xlo, xhi, ylo, yhi, own)) kept.push(pairs[k], pairs[k + 1]);
    }
    const rest = Int32Array.from(kept);
    if (size === 1 || rest.length === 0) {
      for (let cy = iy; cy < iy + size; cy++) {
        for (let cx = ix; cx < ix + size; cx++) {
          const c = cy * gx + cx;
          cell.set(own, 8 * c);
          lists[c] = rest.length > 0 ? rest : null;
          listed += rest.length / 2;
        }
      }
      return;
    }
    const half = size / 2;
    split(ix, iy, half, rest, own);
    split(ix + half, iy, half, rest, own);
    split(ix, iy + half, half, rest, own);
    split(ix + half, iy + half, half, rest, own);
  };
  const all = new Int32Array(2 * E * E);
  for (let e = 0; e < E; e++) {
    for (let f = 0; f < E; f++) {
      all[2 * (e * E + f)] = e;
      all[2 * (e * E + f) + 1] = f;
    }
  }
  split(0, 0, gy, all, new Float64Array(6));
  split(gy, 0, gy, all, new Float64Array(6));
  if (overBudget) return null;

  // the cells' lists, flattened
  const start = new Int32Array(cells + 1);
  for (let c = 0; c < cells; c++) {
    start[c + 1] = start[c] + (lists[c]?.length ?? 0) / 2;
    cell[8 * c + 6] = start[c];
    cell[8 * c + 7] = start[c + 1];
  }
  const le = new Int32Array(listed),
    lf = new Int32Array(listed);
  for (let c = 0; c < cells; c++) {
    const list = lists[c];
    if (!list) continue;
    for (let k = 0; k < list.length; k += 2) {
      le[start[c] + k / 2] = list[k];
      lf[start[c] + k / 2] = list[k + 1];
    }
  }

  /** g(v) for v_y ≥ 0 within reach: the cell's polynomial and its listed pairs (edge-translation.ts's terms). */
  const inside = (dx: number, dy: number): number => {
    let ix = Math.floor((dx + reach) * invH),
      iy = Math.floor(dy * invH);
    if (ix >= gx) ix = gx - 1;
    else if (ix < 0) ix = 0;
    if (iy >= gy) iy = gy - 1;
    const c = iy * gx + ix;
    const o = 8 * c;
    const total =
      cell[o] + dx * (cell[o + 1] + cell[o + 3] * dx + cell[o + 4] * dy) + dy * (cell[o + 2] + cell[o + 5] * dy);
    return cell[o + 6] === cell[o + 7] ? total : total + listedTerms(c, dx, dy);
  };

  /** The listed pairs of cell c at v (v_y ≥ 0): edge-translation.ts's terms, base y = 0. */
  const listedTerms = (c: number, dx: number, dy: number): number => {
    let total = 0;
    for (let k = start[c], end = start[c + 1]; k < end; k++) {
      const e = le[k],
        f = lf[k];
      const ea = x0[e],
        eb = x1[e];
      const fa = x0[f] + dx;
      const fb = x1[f] + dx;
      const xl = ea > fa ? ea : fa;
      const xr = eb < fb ? eb : fb;
      if (xr <= xl) continue;
      const ey = y0[e],
        es = slope[e],
        fy = y0[f] + dy,
        fs = slope[f];
      const el = ey + es * (xl - ea),
        er = ey + es * (xr - ea);
      const gl = fy + fs * (xl - fa),
        gr = fy + fs * (xr - fa);
      const dl = el - gl,
        dr = er - gr;
      let area: number;
      if ((dl <= 0 && dr <= 0) || (dl >= 0 && dr >= 0)) {
        const lowL = dl <= 0 && dr <= 0 ? el : gl;
        const lowR = dl <= 0 && dr <= 0 ? er : gr;
        area = ((xr - xl) * (lowL + lowR)) / 2;
      } else {
        const xc = xl + ((xr - xl) * dl) / (dl - dr);
        const yc = ey + es * (xc - ea);
        const lowL = dl < 0 ? el : gl;
        const lowR = dr < 0 ? er : gr;
        area = ((xc - xl) * (lowL + yc)) / 2 + ((xr - xc) * (lowR + yc)) / 2;
      }
      total += sigma[e] * sigma[f] * area;
    }
    return total;
  };

  const at = (dx: number, dy: number): number => {
    if (dy < 0 || (dy === 0 && dx < 0)) {
      dx = -dx;
      dy = -dy;
    }
    if (dx < -reach || dx > reach || dy > reach) return setCovariance(window, dx, dy);
    return inside(dx, dy);
  };

  const pairWeights: SetCovarianceTable["pairWeights"] = (ax, ay, bx, by, pairs, out) => {
    const w = out && out.length >= pairs.count ? out : new Float64Array(pairs.count);
    const area = window.area;
    const floor = 1e-12 * area;
    const pi = pairs.i,
      pj = pairs.j;
    for (let p = 0, count = pairs.count; p < count; p++) {
      const overlap = at(bx[pj[p]] - ax[pi[p]], by[pj[p]] - ay[pi[p]]);
      w[p] = area / (overlap > floor ? overlap : floor);
    }
    return w;
  };

  return {
    reach,
    at,
    pairWeights,
    cells,
    listed,
    cell,
    gx,
    gy,
    invH,
    listedTerms,
    listE: le,
    listF: lf,
    trapezoids: t,
  };
}

const prepared = new WeakMap<Window, { reach: number; table: SetCovarianceTable | null }>();

/**
 * The window's table for displacements up to `reach`, prepared once and kept with the window (a table of a
 * larger reach serves a smaller one). Null when the window has too many edges (see the budget).
 */
export function setCovarianceTableFor(window: Window, reach: number): SetCovarianceTable | null {
  const hit = prepared.get(window);
  if (hit && hit.reach >= reach) return hit.table;
  const table = createSetCovarianceTable(window, reach);
  prepared.set(window, { reach, table });
  return table;
}

/** Tables kept by window outline and reach, across runs in this thread (each is about 2 MB). */
const RUN_TABLES = 2;
const byOutline = new Map<string, SetCovarianceTable | null>();

/**
 * The table for a run's simulations: prepared for exactly this reach, and kept by the window's outline (its
 * edges), so that the next run in the same trench with the same r max reuses it in this thread instead of
 * preparing it again (a new Window object each run). The table is the one `createSetCovarianceTable`
 * would prepare, so the numbers do not depend on which runs came before in the thread.
 */
export function runSetCovarianceTable(window: Window, reach: number): SetCovarianceTable | null {
  const key = `${reach}|${window.edges.subarray(0, 4 * window.edgeCount).join(",")}`;
  if (byOutline.has(key)) {
    const hit = byOutline.get(key)!;
    // most recently used last
    byOutline.delete(key);
    byOutline.set(key, hit);
    return hit;
  }
  const table = createSetCovarianceTable(window, reach);
  if (byOutline.size >= RUN_TABLES) byOutline.delete(byOutline.keys().next().value as string);
  byOutline.set(key, table);
  return table;
}
