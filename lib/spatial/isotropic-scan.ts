/**
 * The WebAssembly build of the isotropic pair scan (asm/isotropic-scan.ts, embedded by
 * `npm run build:kernel` in isotropic-scan-wasm.ts): the same sums as the TypeScript loop of l-isotropic.ts,
 * about a third faster in the simulation loop. One instance (own linear memory) per estimator; the layout
 * grows when a pattern has more points or edge slots than any before. Where WebAssembly with SIMD is not
 * available, `createWasmIsotropicScan` returns null and the caller keeps the TypeScript loop.
 */
import type { CellGrid } from "./cell-grid";
import type { IsotropicTables } from "./isotropic-weights";
import { ISOTROPIC_SCAN_WASM } from "./isotropic-scan-wasm";

/** Values per prepared slot in isotropic-weights.ts (seg, h, t_a, t_b, sign). */
const SLOT = 5;
/** f64 values per block of two slots in linear memory. */
const BLOCK = 10;
const PAGE = 65536;

type ScanExport = (
  n: number, nx: number, ny: number, reach: number, r2: number, m: number, guessStep: number,
  pSx: number, pSy: number, pCell: number, pBd: number, pTotal: number, pStart: number, pBlocks: number,
  pR: number, pHist: number, pU: number, pExt: number, weigh: number,
) => number;

let compiled: WebAssembly.Module | null | undefined;

/** The compiled kernel, once per thread; null when this runtime cannot compile it (no WebAssembly SIMD). */
export function isotropicScanModule(): WebAssembly.Module | null {
  if (compiled === undefined) {
    try {
      compiled = new WebAssembly.Module(Uint8Array.from(atob(ISOTROPIC_SCAN_WASM), (c) => c.charCodeAt(0)));
    } catch {
      compiled = null;
    }
  }
  return compiled;
}

export interface WasmIsotropicScan {
  /**
   * Add the weighted pairs of the bucketed pattern (grid.sx, grid.sy, n points, tables prepared in the same
   * sorted order) into hist[0..m]; u, when given, is the per-point factor in sorted order. Returns the number
   * of unordered pairs within r max.
   */
  scan(grid: CellGrid, n: number, tables: IsotropicTables, hist: Float64Array, u: Float64Array | null): number;
  /** The same enumeration without weights or bins: the number of pairs (the floor of the cost). */
  countPairs(grid: CellGrid, n: number): number;
}

export function createWasmIsotropicScan(r: Float64Array, grid: CellGrid, reach: number): WasmIsotropicScan | null {
  const mod = isotropicScanModule();
  if (!mod) return null;
  const instance = new WebAssembly.Instance(mod, {});
  const memory = instance.exports.memory as WebAssembly.Memory;
  const run = instance.exports.scan as ScanExport;
  const m = r.length;
  const rmax = r[m - 1];
  const cells = grid.nx * grid.ny;
  let capN = 0, capBlocks = 0;
  let at = { r: 0, hist: 0, ext: 0, cell: 0, sx: 0, sy: 0, bd: 0, total: 0, u: 0, start: 0, blocks: 0 };
  // Stencil of cells of side s = r max / reach: cells dx, dy apart hold points at least
  // ((dx−1)⁺² + (dy−1)⁺²)^½·s apart, so row dy needs |dx| ≤ ⌊√(reach² − (dy−1)²)⌋ + 1 (≤ keeps pairs at
  // exactly r max).
  const ext = Int32Array.from({ length: reach + 1 }, (_, dy) => (dy === 0 ? reach : Math.min(reach, Math.floor(Math.sqrt(reach * reach - (dy - 1) * (dy - 1))) + 1)));
  let f64 = new Float64Array(0), i32 = new Int32Array(0);

  /** Lay out every array for up to n points and b blocks (16-byte aligned, for the SIMD loads). */
  const layout = (n: number, b: number): void => {
    capN = Math.max(n, Math.ceil(capN * 1.25));
    capBlocks = Math.max(b, Math.ceil(capBlocks * 1.25));
    let off = 0;
    const take = (bytes: number): number => {
      const o = off;
      off += Math.ceil(bytes / 16) * 16;
      return o;
    };
    at = {
      r: take(8 * m), hist: take(8 * (m + 1)), ext: take(4 * (reach + 1)), cell: take(4 * (cells + 1)), sx: take(8 * capN), sy: take(8 * capN), bd: take(8 * capN),
      total: take(8 * capN), u: take(8 * capN), start: take(4 * (capN + 1)), blocks: take(8 * BLOCK * capBlocks),
    };
    const pages = Math.ceil(off / PAGE) - memory.buffer.byteLength / PAGE;
    if (pages > 0) memory.grow(pages);
    f64 = new Float64Array(memory.buffer);
    i32 = new Int32Array(memory.buffer);
    f64.set(r, at.r / 8);
    i32.set(ext, at.ext / 4);
  };

  return {
    scan(g, n, t, hist, u) {
      const slotsTotal = t.start[n];
      // blocks needed: at most one per point beyond ⌈slots/2⌉
      const maxBlocks = Math.ceil(slotsTotal / 2) + n;
      if (n > capN || maxBlocks > capBlocks) layout(n, maxBlocks);
      f64.set(g.sx.subarray(0, n), at.sx / 8);
      f64.set(g.sy.subarray(0, n), at.sy / 8);
      f64.set(t.bdist.subarray(0, n), at.bd / 8);
      f64.set(t.total.subarray(0, n), at.total / 8);
      if (u) f64.set(u.subarray(0, n), at.u / 8);
      i32.set(g.cellStart, at.cell / 4);
      const slots = t.slots, start = t.start;
      const startAt = at.start / 4;
      let blk = 0;
      for (let i = 0; i < n; i++) {
        i32[startAt + i] = blk;
        const k1 = start[i + 1];
        for (let k = start[i]; k < k1; k += 2, blk++) {
          const base = at.blocks / 8 + blk * BLOCK;
          for (let v = 0; v < SLOT; v++) f64[base + 2 * v] = slots[k * SLOT + v];
          if (k + 1 < k1) {
            for (let v = 0; v < SLOT; v++) f64[base + 2 * v + 1] = slots[(k + 1) * SLOT + v];
          } else {
            // an empty second lane: never reached (seg = ∞), adds nothing (sign 0), stays finite (h = 1)
            f64[base + 1] = Infinity;
            f64[base + 3] = 1;
            f64[base + 5] = 0;
            f64[base + 7] = 0;
            f64[base + 9] = 0;
          }
        }
      }
      i32[startAt + n] = blk;
      f64.fill(0, at.hist / 8, at.hist / 8 + m + 1);
      const pairs = run(n, g.nx, g.ny, reach, rmax * rmax, m, (m - 1) / rmax, at.sx, at.sy, at.cell, at.bd, at.total, at.start, at.blocks, at.r, at.hist, u ? at.u : 0, at.ext, 1);
      hist.set(f64.subarray(at.hist / 8, at.hist / 8 + m + 1));
      return pairs;
    },
    countPairs(g, n) {
      if (n > capN) layout(n, capBlocks);
      f64.set(g.sx.subarray(0, n), at.sx / 8);
      f64.set(g.sy.subarray(0, n), at.sy / 8);
      i32.set(g.cellStart, at.cell / 4);
      return run(n, g.nx, g.ny, reach, rmax * rmax, m, (m - 1) / rmax, at.sx, at.sy, at.cell, at.bd, at.total, at.start, at.blocks, at.r, at.hist, 0, at.ext, 0);
    },
  };
}
