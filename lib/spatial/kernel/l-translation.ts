/**
 * The CSR envelope test's hot path with the translation correction (Ohser 1983): K̂ and L̂ of one pattern
 * after another in the same window, K̂(r) = |W| / (n(n−1)) · Σ_{i≠j} |W| / g(x_j − x_i) · 1{d_ij < r} with
 * g(v) = |W ∩ (W + v)| — the same estimator as k-function.ts, to rounding. The weight depends only on the
 * pair's displacement, so the window's set covariance is prepared once (set-covariance-table.ts) and each
 * unordered pair is weighed once, by one look-up, in the same pass that enumerates the pairs through a cell
 * grid and bins them: no pair list is stored, and the grid and histogram are reused from one pattern to
 * the next. The pass runs in WebAssembly (translation-scan.ts) where it can, else in the loop below; both
 * weigh each pair by the same operations and add the pairs in the same order.
 */
import { createCellGrid } from "./cell-grid";
import { createWasmTranslationScan, translationScanModule } from "./translation-scan";
import { runSetCovarianceTable, type SetCovarianceTable } from "../geometry/set-covariance-table";
import { createBinning, isAxisRectangle } from "../estimators/r-grid";
import type { Window } from "../types";

/** Cells per r max (the TypeScript isotropic loop's choice: a reach of two cells). */
const REACH = 2;

export interface TranslationLEstimator {
  readonly r: Float64Array;
  /** Write K̂(r) of pattern (x, y, n), n ≥ 2, into out[0..m-1]; returns the number of unordered pairs within r max. */
  k(x: Float64Array, y: Float64Array, n: number, out: Float64Array): number;
  /** Write L̂(r) into out[0..m-1]. */
  l(x: Float64Array, y: Float64Array, n: number, out: Float64Array): number;
  /**
   * One part of the pass, for the benchmark's profile: "bucket" sorts the points into the cell grid;
   * "count" that and the pair enumeration; "bins" that and each pair's distance and bin at unit weight.
   * The rest of the pass is the look-ups.
   */
  part(x: Float64Array, y: Float64Array, n: number, which: "bucket" | "count" | "bins"): number;
  /** Which implementation of the pass runs. */
  readonly kernel: "wasm" | "typescript";
}

export interface TranslationLOptions {
  /** "wasm" (default where available, polygon windows) or "typescript": the same sums (tested). */
  kernel?: "wasm" | "typescript";
}

/**
 * The fused estimator, or null when the window has too many edges for its set covariance to be prepared
 * (then k-function.ts weighs each pair directly).
 */
export function createTranslationL(
  window: Window,
  r: Float64Array,
  table: SetCovarianceTable | null = runSetCovarianceTable(window, r[r.length - 1]),
  options: TranslationLOptions = {},
): TranslationLEstimator | null {
  if (!table) return null;
  const rmax = r[r.length - 1];
  // the WebAssembly pass looks every pair up in the table
  if (table.reach < rmax) throw new RangeError(`The set covariance reaches ${table.reach}, short of r max ${rmax}.`);
  const binning = createBinning(window, r);
  const { bin, edges } = binning;
  const m = r.length;
  // as in l-isotropic.ts: on an even grid the bin is guessed by one multiplication and confirmed against
  // the thresholds; rectangles keep their own rule through the binner (and the loop below)
  const guess = !isAxisRectangle(window);
  const inv = (m - 1) / rmax;
  const grid = createCellGrid(window.bbox, rmax / REACH);
  const r2 = rmax * rmax;
  const { nx, ny, cellStart } = grid;
  const hist = new Float64Array(m + 1);
  const { cell, gx, gy, invH, reach, listedTerms } = table;
  const area = window.area;
  const floor = 1e-12 * area;
  const useWasm = guess && options.kernel !== "typescript" && translationScanModule() !== null;
  // the loop's stencil: whole rows of 2·REACH + 1 cells, so that both add the pairs in the same order
  const wasm = useWasm
    ? createWasmTranslationScan(table, rmax, edges, grid, new Int32Array(REACH + 1).fill(REACH), area)
    : null;

  const sums = (x: Float64Array, y: Float64Array, n: number): number => {
    grid.bucket(x, y, n);
    if (wasm) return wasm.scan(grid, n, hist);
    hist.fill(0);
    const { sx, sy } = grid;
    let pairs = 0;
    for (let cy = 0; cy < ny; cy++) {
      for (let cx = 0; cx < nx; cx++) {
        const s0 = cellStart[cy * nx + cx],
          s1 = cellStart[cy * nx + cx + 1];
        // half stencil: the rest of this cell and the next REACH cells of the row, then the next REACH
        // rows from cx − REACH to cx + REACH (each a contiguous run of sorted positions)
        const rowEnd = cellStart[cy * nx + Math.min(nx - 1, cx + REACH) + 1];
        const lo = Math.max(0, cx - REACH),
          hi = Math.min(nx - 1, cx + REACH);
        for (let p = s0; p < s1; p++) {
          const xa = sx[p],
            ya = sy[p];
          for (let pass = 0; pass <= REACH; pass++) {
            const row = cy + pass;
            if (row >= ny) break;
            const q0 = pass === 0 ? p + 1 : cellStart[row * nx + lo];
            const q1 = pass === 0 ? rowEnd : cellStart[row * nx + hi + 1];
            for (let q = q0; q < q1; q++) {
              let dx = sx[q] - xa,
                dy = sy[q] - ya;
              const dd = dx * dx + dy * dy;
              if (dd > r2) continue;
              pairs++;
              const d = Math.sqrt(dd);
              let b = guess ? Math.floor(d * inv) + 1 : 0;
              if (!(b > 0 && b < m && edges[b - 1] <= d && d < edges[b])) b = bin(d);
              if (b >= m) continue;
              // g is even: look up the displacement with v_y ≥ 0 (the same vector for either order)
              if (dy < 0 || (dy === 0 && dx < 0)) {
                dx = -dx;
                dy = -dy;
              }
              let ix = Math.floor((dx + reach) * invH),
                iy = Math.floor(dy * invH);
              if (ix >= gx) ix = gx - 1;
              else if (ix < 0) ix = 0;
              if (iy >= gy) iy = gy - 1;
              const c = iy * gx + ix;
              const o = 8 * c;
              let g =
                cell[o] +
                dx * (cell[o + 1] + cell[o + 3] * dx + cell[o + 4] * dy) +
                dy * (cell[o + 2] + cell[o + 5] * dy);
              if (cell[o + 6] !== cell[o + 7]) g += listedTerms(c, dx, dy);
              hist[b] += area / (g > floor ? g : floor);
            }
          }
        }
      }
    }
    return pairs;
  };

  const k = (x: Float64Array, y: Float64Array, n: number, out: Float64Array): number => {
    const pairs = sums(x, y, n);
    // one weight per unordered pair, counted for both orders
    const scale = (2 * area) / (n * (n - 1));
    let acc = 0;
    for (let b = 0; b < m; b++) {
      acc += hist[b];
      out[b] = acc * scale;
    }
    return pairs;
  };

  const l = (x: Float64Array, y: Float64Array, n: number, out: Float64Array): number => {
    const pairs = k(x, y, n, out);
    for (let b = 0; b < m; b++) out[b] = Math.sqrt(Math.max(0, out[b]) / Math.PI);
    return pairs;
  };

  const part = (x: Float64Array, y: Float64Array, n: number, which: "bucket" | "count" | "bins"): number => {
    grid.bucket(x, y, n);
    return which === "bucket" || !wasm ? 0 : wasm.scan(grid, n, hist, which);
  };

  return { r, k, l, part, kernel: wasm ? "wasm" : "typescript" };
}
