/**
 * AssemblyScript source of the translation-corrected pair scan, compiled to WebAssembly by
 * `npm run build:kernel` into ../translation-scan-wasm.ts. It is the pass of ../l-translation.ts written for
 * WebAssembly (no bounds checks, no warm-up of the optimising compiler in every worker thread): half-stencil
 * pair enumeration over the cell grid, Ohser's translation weight |W| / g(v) of each unordered pair by one
 * look-up in the window's set covariance (../../geometry/set-covariance-table.ts: the cell's quadratic in v,
 * plus the cell's listed edge pairs summed as edge-translation.ts sums them), binning on the r grid. Each
 * pair's weight is computed by the same operations in the same order as the TypeScript pass, and with the
 * same stencil the pairs are added to the histogram in the same order, so the sums are the same.
 *
 * Every array lives in linear memory at offsets the caller passes (../translation-scan.ts lays them out):
 *   sx, sy      f64[n]        points in cell order
 *   cellStart   i32[cells+1]  first sorted position of each cell
 *   r           f64[m]        bin thresholds: d counts at r[k] when d < r[k] (r-grid.ts binEdges)
 *   hist        f64[m+1]      weighted pair counts per bin (added to)
 *   ext         i32[reach+1]  stencil: row dy of the half stencil spans columns cx − ext[dy] .. cx + ext[dy]
 *               (row 0: cx .. cx + ext[0])
 *   table       f64[8·gx·gy]  per cell of v: the quadratic's terms 1, x, y, x², xy, y², then the first and
 *               end index of its listed edge pairs
 *   le, lf      i32[listed]   the listed edge pairs (e of W, f of W + v)
 *   trapezoids  f64[5·E]      per non-vertical edge: x0, x1, y0, slope, sigma (edge-translation.ts)
 */

import { binSearch } from "./bin-search";

/** The listed edge pairs' terms of a cell at v = (dx, dy), v_y ≥ 0 (set-covariance-table.ts listedTerms). */
function listedTerms(k0: i32, k1: i32, dx: f64, dy: f64, pLe: usize, pLf: usize, pTrap: usize, E: i32): f64 {
  const pX1 = pTrap + ((<usize>E) << 3);
  const pY0 = pX1 + ((<usize>E) << 3);
  const pSlope = pY0 + ((<usize>E) << 3);
  const pSigma = pSlope + ((<usize>E) << 3);
  let total: f64 = 0;
  for (let k = k0; k < k1; k++) {
    const e = <usize>load<i32>(pLe + ((<usize>k) << 2)) << 3;
    const f = <usize>load<i32>(pLf + ((<usize>k) << 2)) << 3;
    const ea = load<f64>(pTrap + e);
    const eb = load<f64>(pX1 + e);
    const fa = load<f64>(pTrap + f) + dx;
    const fb = load<f64>(pX1 + f) + dx;
    const xl = ea > fa ? ea : fa;
    const xr = eb < fb ? eb : fb;
    if (xr <= xl) continue;
    const ey = load<f64>(pY0 + e);
    const es = load<f64>(pSlope + e);
    const fy = load<f64>(pY0 + f) + dy;
    const fs = load<f64>(pSlope + f);
    const el = ey + es * (xl - ea);
    const er = ey + es * (xr - ea);
    const gl = fy + fs * (xl - fa);
    const gr = fy + fs * (xr - fa);
    const dl = el - gl;
    const dr = er - gr;
    let area: f64;
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
    total += load<f64>(pSigma + e) * load<f64>(pSigma + f) * area;
  }
  return total;
}

/**
 * Add every unordered pair within r max (d² ≤ r2) to hist with its translation weight area / g(v), g
 * floored at `floor`. `guessStep` = (m−1)/r max guesses the bin (confirmed against r, else binary search).
 * The table covers v_x ∈ [−tReach, tReach], v_y ∈ [0, tReach] in gx × gy cells of side 1 / invH.
 * Returns the number of pairs; with weigh = 0 it only counts them, with weigh = 2 it bins them at weight 1
 * (the benchmark's profile: what the look-ups add).
 */
export function scan(
  n: i32, nx: i32, ny: i32, reach: i32, r2: f64, m: i32, guessStep: f64,
  pSx: usize, pSy: usize, pCell: usize, pR: usize, pHist: usize, pExt: usize,
  tReach: f64, invH: f64, gx: i32, gy: i32, pTable: usize, pLe: usize, pLf: usize, pTrap: usize, E: i32,
  area: f64, floor: f64, weigh: i32,
): i32 {
  let pairs: i32 = 0;
  for (let cy = 0; cy < ny; cy++) {
    for (let cx = 0; cx < nx; cx++) {
      const c = cy * nx + cx;
      const s0 = load<i32>(pCell + ((<usize>c) << 2));
      const s1 = load<i32>(pCell + ((<usize>(c + 1)) << 2));
      const rowEnd = load<i32>(pCell + ((<usize>(cy * nx + min(nx - 1, cx + load<i32>(pExt)) + 1)) << 2));
      for (let p = s0; p < s1; p++) {
        const xa = load<f64>(pSx + ((<usize>p) << 3));
        const ya = load<f64>(pSy + ((<usize>p) << 3));
        for (let pass = 0; pass <= reach; pass++) {
          const row = cy + pass;
          if (row >= ny) break;
          const e = load<i32>(pExt + ((<usize>pass) << 2));
          const q0 = pass == 0 ? p + 1 : load<i32>(pCell + ((<usize>(row * nx + max(0, cx - e))) << 2));
          const q1 = pass == 0 ? rowEnd : load<i32>(pCell + ((<usize>(row * nx + min(nx - 1, cx + e) + 1)) << 2));
          for (let q = q0; q < q1; q++) {
            let dx = load<f64>(pSx + ((<usize>q) << 3)) - xa;
            let dy = load<f64>(pSy + ((<usize>q) << 3)) - ya;
            const dd = dx * dx + dy * dy;
            if (dd > r2) continue;
            pairs++;
            if (!weigh) continue;
            const d = Math.sqrt(dd);
            let b = <i32>Math.floor(d * guessStep) + 1;
            if (!(b > 0 && b < m && load<f64>(pR + ((<usize>(b - 1)) << 3)) <= d && d < load<f64>(pR + ((<usize>b) << 3)))) b = binSearch(d, pR, m);
            if (b >= m) continue;
            if (weigh == 2) {
              const at = pHist + ((<usize>b) << 3);
              store<f64>(at, load<f64>(at) + 1.0);
              continue;
            }
            // g is even: look up the displacement with v_y ≥ 0 (the same vector for either order)
            if (dy < 0 || (dy == 0 && dx < 0)) {
              dx = -dx;
              dy = -dy;
            }
            let ix = <i32>Math.floor((dx + tReach) * invH);
            let iy = <i32>Math.floor(dy * invH);
            if (ix >= gx) ix = gx - 1;
            else if (ix < 0) ix = 0;
            if (iy >= gy) iy = gy - 1;
            const o = pTable + ((<usize>(iy * gx + ix)) << 6);
            let g = load<f64>(o) +
              dx * (load<f64>(o, 8) + load<f64>(o, 24) * dx + load<f64>(o, 32) * dy) +
              dy * (load<f64>(o, 16) + load<f64>(o, 40) * dy);
            const k0 = load<f64>(o, 48);
            const k1 = load<f64>(o, 56);
            if (k0 != k1) g += listedTerms(<i32>k0, <i32>k1, dx, dy, pLe, pLf, pTrap, E);
            const at = pHist + ((<usize>b) << 3);
            store<f64>(at, load<f64>(at) + area / (g > floor ? g : floor));
          }
        }
      }
    }
  }
  return pairs;
}
