/**
 * The hot path of the CSR envelope test: Ripley's K with the isotropic correction, and Besag's L, for one
 * pattern after another in the same window. K̂(r) = |W| / (n(n−1)) · Σ_{i≠j} w_ij 1{d_ij < r} (Ripley 1976,
 * 1977), L̂ = √(K̂/π) (Besag 1977), with spatstat's conventions (ordered pairs, n(n−1), d < r binned
 * by r-grid.ts; see statistics.md). Pairs are enumerated through a cell grid and weighted in the same
 * pass, so no pair list is
 * stored; the grid, weight tables and histogram are reused from one pattern to the next.
 */
import { createCellGrid } from "./cell-grid";
import { createWasmIsotropicScan, isotropicScanModule } from "./isotropic-scan";
import { createIsotropicWeights, weightBeyond } from "./isotropic-weights";
import { createBinning, isAxisRectangle } from "../estimators/r-grid";
import type { Window } from "../types";

/** Cells per r max of the WebAssembly scan's grid (measured: 4 is 1–3 % faster than 3 at n = 1000–5000, 2 slower). */
const REACH_WASM = 4;

export interface IsotropicLEstimator {
  readonly r: Float64Array;
  /** Write K̂(r) of pattern (x, y, n) into out[0..m-1]; returns the number of unordered pairs within r_max. */
  k(x: Float64Array, y: Float64Array, n: number, out: Float64Array): number;
  /**
   * Write the raw cumulative sums Σ_{i≠j, d_ij < r} w_ij·u_i·u_j into out (u = 1 when omitted): the
   * numerator of K and, with u = 1/λ, of the inhomogeneous K.
   */
  sums(x: Float64Array, y: Float64Array, n: number, out: Float64Array, u?: Float64Array): number;
  /** Write L̂(r) into out[0..m-1]. */
  l(x: Float64Array, y: Float64Array, n: number, out: Float64Array): number;
  /** The same pair enumeration without weights: the floor of the cost (for the benchmark). */
  countPairs(x: Float64Array, y: Float64Array, n: number): number;
  /**
   * One part of the WebAssembly kernel's work, for the benchmark's profile (absent with the TypeScript
   * loop): "bucket" sorts the points into the cell grid; "prepare" that and the points' edge slots; "bins"
   * that and the pair enumeration with distances and bins, at unit weights.
   */
  part?(x: Float64Array, y: Float64Array, n: number, which: "bucket" | "prepare" | "bins"): number;
  /** Which implementation of the weighted scan runs. */
  readonly kernel: "wasm" | "typescript";
}

export interface IsotropicLOptions {
  /**
   * "wasm" (default where available): the WebAssembly build of the weighted scan (isotropic-scan.ts), used
   * for polygon windows; "typescript": the loop below. The two agree to rounding (tested).
   */
  kernel?: "wasm" | "typescript";
}

export function createIsotropicL(
  window: Window,
  r: Float64Array,
  options: IsotropicLOptions = {},
): IsotropicLEstimator {
  const binning = createBinning(window, r);
  const bin = binning.bin;
  // thresholds d is compared with (d counts at r[k] when d < edges[k]; r-grid.ts): the WebAssembly scan and
  // the guess below bin on these, so that a distance equal to a grid value is binned as in exact arithmetic
  const edges = binning.edges;
  const m = r.length;
  const rmax = r[m - 1];
  // In a polygon window r-grid.ts bins by the generic rule (the smallest k with d < r[k]); on an even grid
  // that k is guessed by one multiplication and confirmed against r, and only a failed guess (an uneven
  // grid, d on a grid value) asks the binner. Rectangles keep their own rule through the binner.
  const guess = !isAxisRectangle(window);
  const inv = (m - 1) / rmax;
  // The WebAssembly scan follows the generic (polygon) binning rule only; rectangles keep the loop below.
  const useWasm = guess && options.kernel !== "typescript" && isotropicScanModule() !== null;
  // The TypeScript loop: cells of side r max / 2 with a reach of two cells (about 40 % fewer distance
  // checks than cells of r max). The WebAssembly scan: cells of r max / REACH_WASM with a stencil trimmed
  // to the disc (isotropic-scan.ts), which checks fewer distances again.
  const REACH = useWasm ? REACH_WASM : 2;
  const grid = createCellGrid(window.bbox, rmax / REACH);
  const wasm = useWasm ? createWasmIsotropicScan(window, r, grid, REACH, edges) : null;
  // the TypeScript loop's edge tables (the WebAssembly scan prepares its own in linear memory)
  const weights = wasm ? null : createIsotropicWeights(window, rmax);
  const hist = new Float64Array(m + 1);
  const { nx, ny, cellStart } = grid;
  const r2 = rmax * rmax;

  let su = new Float64Array(0);
  const scan = (x: Float64Array, y: Float64Array, n: number, weigh: boolean, u?: Float64Array): number => {
    grid.bucket(x, y, n);
    if (wasm && !weigh) return wasm.countPairs(grid, n);
    const { sx, sy, order } = grid;
    if (u) {
      if (su.length < n) su = new Float64Array(n);
      for (let p = 0; p < n; p++) su[p] = u[order[p]];
    }
    if (wasm) return wasm.scan(grid, n, hist, u ? su : null);
    // Prepared in sorted order so that the tables are read in memory order inside the loop.
    const tables = weigh && weights ? weights.prepare(sx, sy, n) : null;
    const bd = tables ? tables.bdist : sx,
      st = tables ? tables.start : order,
      sl = tables ? tables.slots : sx,
      tot = tables ? tables.total : sx;
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
              const dx = sx[q] - xa,
                dy = sy[q] - ya,
                dd = dx * dx + dy * dy;
              if (dd > r2) continue;
              pairs++;
              if (tables === null) continue;
              const d = Math.sqrt(dd);
              // most circles of the pair lie wholly inside W (weight 1): test that here, without a call
              const invD = 1 / d;
              const w =
                (d <= bd[p] ? 1 : weightBeyond(st, sl, tot, p, d, invD)) +
                (d <= bd[q] ? 1 : weightBeyond(st, sl, tot, q, d, invD));
              let b = guess ? Math.floor(d * inv) + 1 : 0;
              if (!(b > 0 && b < m && edges[b - 1] <= d && d < edges[b])) b = bin(d);
              hist[b] += u ? w * su[p] * su[q] : w;
            }
          }
        }
      }
    }
    return pairs;
  };

  const sums = (x: Float64Array, y: Float64Array, n: number, out: Float64Array, u?: Float64Array): number => {
    hist.fill(0);
    const pairs = scan(x, y, n, true, u);
    let acc = 0;
    for (let b = 0; b < m; b++) {
      acc += hist[b];
      out[b] = acc;
    }
    return pairs;
  };

  const k = (x: Float64Array, y: Float64Array, n: number, out: Float64Array): number => {
    const pairs = sums(x, y, n, out);
    const scale = window.area / (n * (n - 1));
    for (let b = 0; b < m; b++) out[b] *= scale;
    return pairs;
  };

  const l = (x: Float64Array, y: Float64Array, n: number, out: Float64Array): number => {
    const pairs = k(x, y, n, out);
    for (let b = 0; b < m; b++) out[b] = Math.sqrt(out[b] / Math.PI);
    return pairs;
  };

  const part = (x: Float64Array, y: Float64Array, n: number, which: "bucket" | "prepare" | "bins"): number => {
    grid.bucket(x, y, n);
    return which === "bucket" || !wasm ? 0 : wasm.part(grid, n, hist, which);
  };
  return {
    r,
    k,
    l,
    sums,
    countPairs: (x, y, n) => scan(x, y, n, false),
    kernel: wasm ? "wasm" : "typescript",
    ...(wasm && { part }),
  };
}
