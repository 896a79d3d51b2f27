/**
 * The WebAssembly build of the translation-corrected pair scan (asm/translation-scan.ts, embedded by
 * `npm run build:kernel` in translation-scan-wasm.ts): the pass of l-translation.ts — enumeration, one
 * look-up per pair in the window's set covariance, binning — in linear memory. One instance (own memory)
 * per estimator; the table is copied in once, the points' arrays grow when a pattern has more points than
 * any before. Where WebAssembly is not available, `createWasmTranslationScan` returns null and the caller
 * keeps the TypeScript pass.
 */
import type { CellGrid } from "./cell-grid";
import { TRANSLATION_SCAN_WASM } from "./translation-scan-wasm";
import { embeddedModule, layOut } from "./wasm-module";
import type { SetCovarianceTable } from "../geometry/set-covariance-table";

type ScanExport = (
  n: number,
  nx: number,
  ny: number,
  reach: number,
  r2: number,
  m: number,
  guessStep: number,
  pSx: number,
  pSy: number,
  pCell: number,
  pR: number,
  pHist: number,
  pExt: number,
  tReach: number,
  invH: number,
  gx: number,
  gy: number,
  pTable: number,
  pLe: number,
  pLf: number,
  pTrap: number,
  edgeCount: number,
  area: number,
  floor: number,
  weigh: number,
) => number;

/** The compiled kernel, once per thread; null when this runtime cannot compile it. */
export const translationScanModule = embeddedModule(TRANSLATION_SCAN_WASM);

export interface WasmTranslationScan {
  /**
   * Weigh and bin every pair of the bucketed pattern (grid.sx, grid.sy, n points) into hist[0..m]
   * (overwritten). Returns the number of unordered pairs within r max. "count" only enumerates (the floor of
   * the cost); "bins" bins at unit weight (the benchmark's profile: what the look-ups add).
   */
  scan(grid: CellGrid, n: number, hist: Float64Array, which?: "weigh" | "count" | "bins"): number;
}

/**
 * Pairs within `rmax` are enumerated. `ext[dy]`: the half stencil's row dy spans columns cx − ext[dy] ..
 * cx + ext[dy] of the grid (row 0 from cx); `binEdges` are the thresholds a distance is binned on (r-grid.ts
 * createBinning, the generic rule).
 */
export function createWasmTranslationScan(
  table: SetCovarianceTable,
  rmax: number,
  binEdges: Float64Array,
  grid: CellGrid,
  ext: Int32Array,
  area: number,
): WasmTranslationScan | null {
  const mod = translationScanModule();
  if (!mod) return null;
  const instance = new WebAssembly.Instance(mod, {});
  const memory = instance.exports.memory as WebAssembly.Memory;
  const run = instance.exports.scan as ScanExport;
  const m = binEdges.length;
  const cells = grid.nx * grid.ny;
  const reach = ext.length - 1;
  const { cell, gx, gy, invH, listE, listF, trapezoids: t } = table;
  const E = t.count;
  let capN = 0;
  let at = { table: 0, le: 0, lf: 0, trap: 0, r: 0, hist: 0, ext: 0, cell: 0, sx: 0, sy: 0 };
  let f64 = new Float64Array(0),
    i32 = new Int32Array(0);

  /** Lay out every array for up to n points; the fixed ones (table first, on cache-line boundaries) are copied in. */
  const layout = (n: number): void => {
    capN = n;
    at = layOut(
      memory,
      {
        table: 8 * cell.length,
        le: 4 * listE.length,
        lf: 4 * listF.length,
        trap: 8 * 5 * E,
        r: 8 * m,
        hist: 8 * (m + 1),
        ext: 4 * ext.length,
        cell: 4 * (cells + 1),
        sx: 8 * capN,
        sy: 8 * capN,
      },
      { table: 64 },
    );
    f64 = new Float64Array(memory.buffer);
    i32 = new Int32Array(memory.buffer);
    f64.set(cell, at.table / 8);
    i32.set(listE, at.le / 4);
    i32.set(listF, at.lf / 4);
    [t.x0, t.x1, t.y0, t.slope, t.sigma].forEach((a, k) => f64.set(a.subarray(0, E), at.trap / 8 + k * E));
    f64.set(binEdges, at.r / 8);
    i32.set(ext, at.ext / 4);
  };
  layout(0);

  return {
    scan(g, n, hist, which = "weigh") {
      if (n > capN) layout(Math.ceil(n * 1.25));
      f64.set(g.sx.subarray(0, n), at.sx / 8);
      f64.set(g.sy.subarray(0, n), at.sy / 8);
      i32.set(g.cellStart, at.cell / 4);
      f64.fill(0, at.hist / 8, at.hist / 8 + m + 1);
      const pairs = run(
        n,
        g.nx,
        g.ny,
        reach,
        rmax * rmax,
        m,
        (m - 1) / rmax,
        at.sx,
        at.sy,
        at.cell,
        at.r,
        at.hist,
        at.ext,
        table.reach,
        invH,
        gx,
        gy,
        at.table,
        at.le,
        at.lf,
        at.trap,
        E,
        area,
        1e-12 * area,
        which === "weigh" ? 1 : which === "bins" ? 2 : 0,
      );
      hist.set(f64.subarray(at.hist / 8, at.hist / 8 + m + 1));
      return pairs;
    },
  };
}
