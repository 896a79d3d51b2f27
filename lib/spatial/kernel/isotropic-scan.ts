/**
 * The WebAssembly build of the isotropic pair scan (asm/isotropic-scan.ts, embedded by
 * `npm run build:kernel` in isotropic-scan-wasm.ts): the same sums as the TypeScript loop of l-isotropic.ts
 * with the edge slots of isotropic-weights.ts, prepared and scanned in linear memory. One instance (own
 * memory) per estimator; the layout grows when a pattern has more points or edge slots than any before.
 * Where WebAssembly with SIMD is not available, `createWasmIsotropicScan` returns null and the caller keeps
 * the TypeScript loop.
 */
import type { CellGrid } from "./cell-grid";
import { fanAngle } from "../geometry/edge-isotropic";
import { ISOTROPIC_SCAN_WASM } from "./isotropic-scan-wasm";
import { embeddedModule, layOut } from "./wasm-module";
import { edgeTolerance } from "./isotropic-weights";
import type { Window } from "../types";

/** f64 values per block of two edge slots in linear memory (asm/isotropic-scan.ts). */
const BLOCK = 10;

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
  pBd: number,
  pTotal: number,
  pStart: number,
  pBlocks: number,
  pR: number,
  pHist: number,
  pU: number,
  pExt: number,
  weigh: number,
  pNear: number,
  pNearDd: number,
) => number;
type PrepareExport = (
  n: number,
  edgeCount: number,
  rmax: number,
  tol: number,
  pSx: number,
  pSy: number,
  pEdges: number,
  pBd: number,
  pTotal: number,
  pStart: number,
  pBlocks: number,
  blockCap: number,
  pScratch: number,
) => number;

/** The compiled kernel, once per thread; null when this runtime cannot compile it (no WebAssembly SIMD). */
export const isotropicScanModule = embeddedModule(ISOTROPIC_SCAN_WASM);

export interface WasmIsotropicScan {
  /**
   * Weigh and bin every pair of the bucketed pattern (grid.sx, grid.sy, n points) into hist[0..m]
   * (overwritten); u, when given, is the per-point factor in the grid's sorted order. Returns the number of
   * unordered pairs within r max.
   */
  scan(grid: CellGrid, n: number, hist: Float64Array, u: Float64Array | null): number;
  /** The same enumeration without weights or bins: the number of pairs (the floor of the cost). */
  countPairs(grid: CellGrid, n: number): number;
  /**
   * Parts of `scan` on their own, for the benchmark's profile: "prepare" the edge slots only; "bins" the
   * enumeration with distances and bins but unit weights (no edge slots).
   */
  part(grid: CellGrid, n: number, hist: Float64Array, which: "prepare" | "bins"): number;
}

/**
 * `r` sets r max (pairs within it are enumerated and weighed); `binEdges` (default r) are the thresholds a
 * distance is binned on: d counts at r[k] when d < edges[k] (r-grid.ts createBinning).
 */
export function createWasmIsotropicScan(
  window: Window,
  r: Float64Array,
  grid: CellGrid,
  reach: number,
  binEdges: Float64Array = r,
): WasmIsotropicScan | null {
  const mod = isotropicScanModule();
  if (!mod) return null;
  const instance = new WebAssembly.Instance(mod, {});
  const memory = instance.exports.memory as WebAssembly.Memory;
  const runScan = instance.exports.scan as ScanExport;
  const runPrepare = instance.exports.prepare as PrepareExport;
  const m = r.length;
  const rmax = r[m - 1];
  const cells = grid.nx * grid.ny;
  const { edges, edgeCount } = window;
  const tol = edgeTolerance(window);
  // Stencil of cells of side s = r max / reach: cells dx, dy apart hold points at least
  // ((dx−1)⁺² + (dy−1)⁺²)^½·s apart, so row dy needs |dx| ≤ ⌊√(reach² − (dy−1)²)⌋ + 1 (≤ keeps pairs at
  // exactly r max).
  const ext = Int32Array.from({ length: reach + 1 }, (_, dy) =>
    dy === 0 ? reach : Math.min(reach, Math.floor(Math.sqrt(reach * reach - (dy - 1) * (dy - 1))) + 1),
  );
  let capN = 0,
    capBlocks = 0;
  let at = {
    r: 0,
    hist: 0,
    ext: 0,
    edges: 0,
    scratch: 0,
    cell: 0,
    sx: 0,
    sy: 0,
    bd: 0,
    total: 0,
    u: 0,
    start: 0,
    blocks: 0,
    near: 0,
    nearDd: 0,
  };
  let f64 = new Float64Array(0),
    i32 = new Int32Array(0);

  /** Lay out every array for up to n points and b blocks (16-byte aligned, for the SIMD loads). */
  const layout = (n: number, b: number): void => {
    capN = Math.max(n, capN);
    capBlocks = Math.max(b, capBlocks);
    at = layOut(memory, {
      r: 8 * m,
      hist: 8 * (m + 1),
      ext: 4 * (reach + 1),
      edges: 32 * edgeCount,
      scratch: 40 * edgeCount,
      cell: 4 * (cells + 1),
      sx: 8 * capN,
      sy: 8 * capN,
      bd: 8 * capN,
      total: 8 * capN,
      u: 8 * capN,
      start: 4 * (capN + 1),
      blocks: 8 * BLOCK * capBlocks,
      near: 4 * capN,
      nearDd: 8 * capN,
    });
    f64 = new Float64Array(memory.buffer);
    i32 = new Int32Array(memory.buffer);
    f64.set(binEdges, at.r / 8);
    f64.set(edges.subarray(0, 4 * edgeCount), at.edges / 8);
    i32.set(ext, at.ext / 4);
  };

  const load = (g: CellGrid, n: number): void => {
    if (n > capN) layout(Math.ceil(n * 1.25), Math.max(capBlocks, Math.ceil(n * 1.25) * 2));
    f64.set(g.sx.subarray(0, n), at.sx / 8);
    f64.set(g.sy.subarray(0, n), at.sy / 8);
    i32.set(g.cellStart, at.cell / 4);
  };

  /** Fill the points' edge slots, growing the blocks when a pattern needs more than any before. */
  const prepare = (g: CellGrid, n: number, u: Float64Array | null): void => {
    load(g, n);
    if (u) f64.set(u.subarray(0, n), at.u / 8);
    while (
      runPrepare(
        n,
        edgeCount,
        rmax,
        tol,
        at.sx,
        at.sy,
        at.edges,
        at.bd,
        at.total,
        at.start,
        at.blocks,
        capBlocks,
        at.scratch,
      ) < 0
    ) {
      // more edge slots than ever before: room for every point to have every edge within r max
      layout(capN, n * Math.ceil(edgeCount / 2));
      load(g, n);
      if (u) f64.set(u.subarray(0, n), at.u / 8);
    }
  };

  /** The scan over the loaded pattern (weigh: 0 count, 1 weigh, 2 unit weights); hist gets the bins. */
  const run = (g: CellGrid, n: number, hist: Float64Array | null, weigh: 0 | 1 | 2, u: boolean): number => {
    if (hist) f64.fill(0, at.hist / 8, at.hist / 8 + m + 1);
    const pairs = runScan(
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
      at.bd,
      at.total,
      at.start,
      at.blocks,
      at.r,
      at.hist,
      u ? at.u : 0,
      at.ext,
      weigh,
      at.near,
      at.nearDd,
    );
    if (hist) hist.set(f64.subarray(at.hist / 8, at.hist / 8 + m + 1));
    return pairs;
  };

  return {
    scan(g, n, hist, u) {
      prepare(g, n, u);
      // a find digitised on the trench edge sees less than 2π of W (computed here, as isotropic-weights.ts)
      const t0 = at.total / 8;
      for (let i = 0; i < n; i++) if (f64[t0 + i] < 0) f64[t0 + i] = fanAngle(edges, edgeCount, g.sx[i], g.sy[i], tol);
      return run(g, n, hist, 1, u !== null);
    },
    part(g, n, hist, which) {
      if (which === "prepare") {
        prepare(g, n, null);
        return 0;
      }
      load(g, n);
      return run(g, n, hist, 2, false);
    },
    countPairs(g, n) {
      load(g, n);
      return run(g, n, null, 0, false);
    },
  };
}
