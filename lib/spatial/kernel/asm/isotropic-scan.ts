/**
 * AssemblyScript source of the isotropic pair scan, compiled to WebAssembly (with 128-bit SIMD) by
 * `npm run build:kernel` into ../isotropic-scan-wasm.ts. It is the same computation as the TypeScript loop
 * of ../l-isotropic.ts — half-stencil pair enumeration over the cell grid, Ripley's isotropic weight of
 * each end of a pair from the prepared edge slots (fan decomposition, acos by Abramowitz & Stegun 4.4.46),
 * binning on the r grid — written for WebAssembly so that the bounds checks go and the two nearest edge
 * slots of a centre are weighed in one pair of SIMD lanes.
 *
 * Every array lives in linear memory at offsets the caller passes (../isotropic-scan.ts lays them out):
 *   sx, sy      f64[n]        points in cell order
 *   cellStart   i32[cells+1]  first sorted position of each cell
 *   bd, total   f64[n]        boundary distance; angle of W seen from the point (2π inside)
 *   blockStart  i32[n+1]      point i's slot blocks are blockStart[i] .. blockStart[i+1]-1
 *   blocks      80 bytes each: two slots side by side as f64 pairs (seg₀ seg₁ | h₀ h₁ | ta₀ ta₁ | tb₀ tb₁ |
 *               sign₀ sign₁), slots sorted by segment distance; a missing second slot has seg = ∞, sign = 0
 *   r           f64[m]        the r grid
 *   hist        f64[m+1]      weighted pair counts per bin (added to)
 *   u           f64[n]        optional factor per point (0 = none): pair weight w·u_p·u_q
 *   ext         i32[reach+1]  stencil: row dy of the half stencil spans columns cx − ext[dy] .. cx + ext[dy]
 *               (row 0: cx .. cx + ext[0]); only cells that can hold a point within r max of the cell
 *   near, nearDd  i32[n], f64[n]  scratch: the points within r max of the current centre, and their d²
 *
 * `prepare` fills bd, total and the blocks from the window's edges (f64[4·E]: ax ay bx by) as
 * isotropic-weights.ts prepares its slots; a point on the boundary (bd ≤ tol) gets total = −1 and the caller
 * computes its angle (edge-isotropic.ts fanAngle).
 *
 * A slot that the circle does not reach (seg ≥ d) adds nothing even when computed: x = h/d is clamped to
 * 1 (β = 0) or its angular range [ta, tb] misses (−β, β); so only whole blocks are skipped, by the sorted
 * first segment distance.
 */

import { binSearch } from "./bin-search";

const TWO_PI: f64 = 6.283185307179586;
const MAX_WEIGHT: f64 = 100;
const BLOCK: usize = 80;

/** Isotropic weight of centre i at distance d > its boundary distance (inv = 1/d). */
@inline function weightBeyond(i: i32, d: f64, inv: f64, pStart: usize, pBlocks: usize, pTotal: usize): f64 {
  let lost = f64x2.splat(0);
  const invv = f64x2.splat(inv);
  const one = f64x2.splat(1);
  const b0 = load<i32>(pStart + ((<usize>i) << 2));
  const b1 = load<i32>(pStart + ((<usize>(i + 1)) << 2));
  for (let b = b0; b < b1; b++) {
    const base = pBlocks + (<usize>b) * BLOCK;
    if (load<f64>(base) >= d) break;
    // pmin (one < x ? one : x) compiles to a single minpd; min's NaN and signed-zero rules cost several
    // instructions more, and x is never NaN here
    const x = f64x2.pmin(f64x2.mul(v128.load(base, 16), invv), one);
    const x2 = f64x2.mul(x, x);
    const x4 = f64x2.mul(x2, x2);
    // acos(x) = √(1−x)·P(x), P of degree 7 in Estrin's form (the same terms as isotropic-weights.ts)
    const q0 = f64x2.add(f64x2.splat(1.570796305), f64x2.mul(x, f64x2.splat(-0.2145988016)));
    const q1 = f64x2.mul(x2, f64x2.add(f64x2.splat(0.0889789874), f64x2.mul(x, f64x2.splat(-0.0501743046))));
    const q2 = f64x2.add(
      f64x2.add(f64x2.splat(0.030891881), f64x2.mul(x, f64x2.splat(-0.0170881256))),
      f64x2.mul(x2, f64x2.add(f64x2.splat(0.0066700901), f64x2.mul(x, f64x2.splat(-0.0012624911)))),
    );
    const beta = f64x2.mul(f64x2.sqrt(f64x2.sub(one, x)), f64x2.add(f64x2.add(q0, q1), f64x2.mul(x4, q2)));
    const ta = v128.load(base, 32);
    const tb = v128.load(base, 48);
    const sign = v128.load(base, 64);
    // four times |[ta, tb] ∩ [−β, β]|, without branches (see isotropic-weights.ts)
    const z = f64x2.sub(f64x2.sub(f64x2.add(f64x2.sub(tb, ta), f64x2.add(beta, beta)), f64x2.abs(f64x2.sub(tb, beta))), f64x2.abs(f64x2.add(ta, beta)));
    lost = f64x2.add(lost, f64x2.mul(sign, f64x2.add(z, f64x2.abs(z))));
  }
  const theta = load<f64>(pTotal + ((<usize>i) << 3)) - 0.25 * (f64x2.extract_lane(lost, 0) + f64x2.extract_lane(lost, 1));
  if (!(theta * MAX_WEIGHT > TWO_PI)) return MAX_WEIGHT;
  const w = TWO_PI / theta;
  return w > 1 ? w : 1;
}

/**
 * Add every unordered pair within r max (d² ≤ r2) to hist: w(p, d) + w(q, d), times u_p·u_q when pU ≠ 0.
 * `guessStep` = (m−1)/r max guesses the bin on an even grid (confirmed against r, else binary search).
 * Returns the number of pairs; with weigh = 0 it only counts them (the benchmark's floor), with weigh = 2
 * it bins them with weight 1 at each end (the benchmark's profile: what the edge weights add).
 */
export function scan(
  n: i32, nx: i32, ny: i32, reach: i32, r2: f64, m: i32, guessStep: f64,
  pSx: usize, pSy: usize, pCell: usize, pBd: usize, pTotal: usize, pStart: usize, pBlocks: usize,
  pR: usize, pHist: usize, pU: usize, pExt: usize, weigh: i32, pNear: usize, pNearDd: usize,
): i32 {
  let pairs: i32 = 0;
  for (let cy = 0; cy < ny; cy++) {
    for (let cx = 0; cx < nx; cx++) {
      const c = cy * nx + cx;
      const s0 = load<i32>(pCell + ((<usize>c) << 2));
      const s1 = load<i32>(pCell + ((<usize>(c + 1)) << 2));
      // half stencil: the rest of this cell and the next ext[0] cells of the row, then the next `reach`
      // rows from cx − ext[dy] to cx + ext[dy] (each a contiguous run of sorted positions)
      const rowEnd = load<i32>(pCell + ((<usize>(cy * nx + min(nx - 1, cx + load<i32>(pExt)) + 1)) << 2));
      for (let p = s0; p < s1; p++) {
        const xa = load<f64>(pSx + ((<usize>p) << 3));
        const ya = load<f64>(pSy + ((<usize>p) << 3));
        // first every point of the stencil within r max, kept in order without a branch (whether a
        // candidate is near is close to a coin toss, which a branch would mispredict), then those weighed
        let near: i32 = 0;
        for (let pass = 0; pass <= reach; pass++) {
          const row = cy + pass;
          if (row >= ny) break;
          const e = load<i32>(pExt + ((<usize>pass) << 2));
          const q0 = pass == 0 ? p + 1 : load<i32>(pCell + ((<usize>(row * nx + max(0, cx - e))) << 2));
          const q1 = pass == 0 ? rowEnd : load<i32>(pCell + ((<usize>(row * nx + min(nx - 1, cx + e) + 1)) << 2));
          for (let q = q0; q < q1; q++) {
            const dx = load<f64>(pSx + ((<usize>q) << 3)) - xa;
            const dy = load<f64>(pSy + ((<usize>q) << 3)) - ya;
            const dd = dx * dx + dy * dy;
            store<i32>(pNear + ((<usize>near) << 2), q);
            store<f64>(pNearDd + ((<usize>near) << 3), dd);
            near += <i32>(dd <= r2);
          }
        }
        pairs += near;
        if (!weigh) continue;
        const bdp = load<f64>(pBd + ((<usize>p) << 3));
        const up = pU ? load<f64>(pU + ((<usize>p) << 3)) : 1.0;
        for (let k = 0; k < near; k++) {
          const q = load<i32>(pNear + ((<usize>k) << 2));
          const d = Math.sqrt(load<f64>(pNearDd + ((<usize>k) << 3)));
          const inv = 1 / d;
          // weigh = 2 (the benchmark's profile): distances and bins with unit weights, no edge correction
          const w = weigh == 2 ? 2.0 :
            (d <= bdp ? 1.0 : weightBeyond(p, d, inv, pStart, pBlocks, pTotal)) +
            (d <= load<f64>(pBd + ((<usize>q) << 3)) ? 1.0 : weightBeyond(q, d, inv, pStart, pBlocks, pTotal));
          let b = <i32>Math.floor(d * guessStep) + 1;
          if (!(b > 0 && b < m && load<f64>(pR + ((<usize>(b - 1)) << 3)) <= d && d < load<f64>(pR + ((<usize>b) << 3)))) b = binSearch(d, pR, m);
          const at = pHist + ((<usize>b) << 3);
          store<f64>(at, load<f64>(at) + (pU ? w * up * load<f64>(pU + ((<usize>q) << 3)) : w));
        }
      }
    }
  }
  return pairs;
}

/**
 * Edge slots of points (sx, sy)[0..n-1]: for every edge nearer than r max (segment distance seg, line
 * distance h > tol), h, the end angles t_a, t_b seen from the point about the foot of the perpendicular,
 * and the side (+1 when the point is on W's side). Slots are sorted by seg (insertion through a scratch row
 * of E slots at pScratch) and written two to a block. Returns the number of blocks, or −1 when more than
 * blockCap would be needed (the caller grows the memory and calls again).
 */
export function prepare(
  n: i32, edgeCount: i32, rmax: f64, tol: f64,
  pSx: usize, pSy: usize, pEdges: usize, pBd: usize, pTotal: usize, pStart: usize, pBlocks: usize,
  blockCap: i32, pScratch: usize,
): i32 {
  let blk: i32 = 0;
  for (let i = 0; i < n; i++) {
    store<i32>(pStart + ((<usize>i) << 2), blk);
    const cx = load<f64>(pSx + ((<usize>i) << 3));
    const cy = load<f64>(pSy + ((<usize>i) << 3));
    let best = Infinity;
    let count: i32 = 0;
    for (let e = 0; e < edgeCount; e++) {
      const pe = pEdges + (<usize>e) * 32;
      const ax = load<f64>(pe) - cx;
      const ay = load<f64>(pe, 8) - cy;
      const ex = load<f64>(pe, 16) - cx - ax;
      const ey = load<f64>(pe, 24) - cy - ay;
      const len2 = ex * ex + ey * ey;
      let t = -(ax * ex + ay * ey) / len2;
      t = t < 0 ? 0 : t > 1 ? 1 : t;
      const px = ax + t * ex;
      const py = ay + t * ey;
      const seg = Math.sqrt(px * px + py * py);
      if (seg < best) best = seg;
      if (seg >= rmax) continue;
      const len = Math.sqrt(len2);
      const cross = ax * ey - ay * ex;
      const h = Math.abs(cross) / len;
      if (h <= tol) continue;
      // insertion by segment distance among this point's slots (5 values each in the scratch row)
      let at = count;
      while (at > 0 && load<f64>(pScratch + (<usize>(at - 1)) * 40) > seg) {
        const from = pScratch + (<usize>(at - 1)) * 40;
        memory.copy(from + 40, from, 40);
        at--;
      }
      const slot = pScratch + (<usize>at) * 40;
      store<f64>(slot, seg);
      store<f64>(slot, h, 8);
      store<f64>(slot, Math.atan((ax * ex + ay * ey) / len / h), 16);
      store<f64>(slot, Math.atan(((ax + ex) * ex + (ay + ey) * ey) / len / h), 24);
      store<f64>(slot, cross > 0 ? 1.0 : -1.0, 32);
      count++;
    }
    store<f64>(pBd + ((<usize>i) << 3), best);
    store<f64>(pTotal + ((<usize>i) << 3), best <= tol ? -1.0 : TWO_PI);
    const need = (count + 1) >> 1;
    if (blk + need > blockCap) return -1;
    for (let k = 0; k < count; k += 2) {
      const base = pBlocks + (<usize>blk) * BLOCK;
      const a = pScratch + (<usize>k) * 40;
      for (let v: usize = 0; v < 5; v++) store<f64>(base + v * 16, load<f64>(a + v * 8));
      if (k + 1 < count) {
        const b = a + 40;
        for (let v: usize = 0; v < 5; v++) store<f64>(base + v * 16 + 8, load<f64>(b + v * 8));
      } else {
        // an empty second lane: never reached (seg = ∞), adds nothing (sign 0), stays finite (h = 1)
        store<f64>(base, Infinity, 8);
        store<f64>(base, 1.0, 24);
        store<f64>(base, 0.0, 40);
        store<f64>(base, 0.0, 56);
        store<f64>(base, 0.0, 72);
      }
      blk++;
    }
  }
  store<i32>(pStart + ((<usize>n) << 2), blk);
  return blk;
}
