/**
 * Ripley's (1977) isotropic edge correction, exact for polygons with holes: the weight of the ordered pair
 * (i, j) is 2π / θ, θ the angle of the circle centred at x_i through x_j that lies inside W. Clamped to
 * [1, 100] as spatstat 3.x `edge.Ripley` does.
 *
 * θ is computed from a signed triangle fan: with apex c = x_i, the indicator of W equals Σ_e s_e·1{triangle
 * (c, a_e, b_e)} over all edges e = a_e→b_e of all rings (s_e = ±1 its orientation seen from c). The circle
 * meets the triangle of e in the wedge of directions towards e minus the directions in which e's line is
 * nearer than r, i.e. [ψ − β, ψ + β] about the foot ψ of the perpendicular, β = acos(h/r), h the distance
 * to the line. So θ = Σ_e s_e·wedge_e − Σ_{e: h_e < r} s_e·|wedge_e ∩ [ψ−β, ψ+β]|, and only edges nearer
 * than r to c contribute to the second sum: for most pairs it is empty and the weight is 1.
 */
import type { PairList } from "./neighbours";
import type { Window } from "../types";

const TWO_PI = 2 * Math.PI;

/** Per-point data on the edges within r max: everything in the weight that does not depend on r. */
export interface IsotropicEdgeData {
  /** Near edges of point k are entries start[k] .. start[k+1]-1. */
  start: Int32Array;
  /** Distance from the point to the edge's line, and to the edge itself (near edges sorted by the latter). */
  h: Float64Array;
  reach: Float64Array;
  /** Distance from each point to the boundary: circles no larger lie wholly inside W. */
  bdist: Float64Array;
  /** Wedge of directions towards the edge, as angles from the perpendicular foot (lo < hi). */
  lo: Float64Array;
  hi: Float64Array;
  /** +1 when the point is on the interior side of the edge, −1 otherwise. */
  sign: Float64Array;
  /** Σ_e s_e·wedge_e: 2π for interior points, less for points on the boundary. */
  total: Float64Array;
}

/** Σ_e s_e·wedge_e over all edges: the angle of W seen from c (π on an edge, the corner angle at a vertex). */
export function fanAngle(edges: Float64Array, edgeCount: number, cx: number, cy: number, tol: number): number {
  let sum = 0;
  for (let e = 0; e < edgeCount; e++) {
    const ax = edges[4 * e] - cx,
      ay = edges[4 * e + 1] - cy;
    const bx = edges[4 * e + 2] - cx,
      by = edges[4 * e + 3] - cy;
    const cross = ax * by - ay * bx;
    if (Math.abs(cross) <= tol * Math.hypot(bx - ax, by - ay)) continue;
    sum += Math.atan2(cross, ax * bx + ay * by);
  }
  return sum;
}

/** Precompute, for n points, the edges of W within `rmax` of each point. */
export function isotropicEdgeData(
  window: Window,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  n: number,
  rmax: number,
): IsotropicEdgeData {
  const { edges, edgeCount, bbox } = window;
  const tol = 1e-12 * Math.max(bbox.maxX - bbox.minX, bbox.maxY - bbox.minY);
  const start = new Int32Array(n + 1);
  let cap = Math.max(16, n);
  let h = new Float64Array(cap),
    reach = new Float64Array(cap),
    lo = new Float64Array(cap),
    hi = new Float64Array(cap);
  let sign = new Float64Array(cap);
  const total = new Float64Array(n);
  const bdist = new Float64Array(n);
  let count = 0;
  for (let k = 0; k < n; k++) {
    start[k] = count;
    const cx = x[k];
    const cy = y[k];
    let onBoundary = false;
    let nearest = Infinity;
    for (let e = 0; e < edgeCount; e++) {
      const ax = edges[4 * e] - cx,
        ay = edges[4 * e + 1] - cy;
      const ex = edges[4 * e + 2] - cx - ax,
        ey = edges[4 * e + 3] - cy - ay;
      const len = Math.sqrt(ex * ex + ey * ey);
      const ux = ex / len,
        uy = ey / len;
      const sa = ax * ux + ay * uy;
      const t = Math.max(0, Math.min(len, -sa));
      const qx = ax + t * ux,
        qy = ay + t * uy;
      const segDist = Math.sqrt(qx * qx + qy * qy);
      if (segDist <= tol) onBoundary = true;
      if (segDist < nearest) nearest = segDist;
      if (segDist >= rmax) continue; // a circle of radius < rmax cannot reach this edge
      // signed distance of c from the line, positive when c is on the left (interior) side
      const hs = uy * ax - ux * ay;
      const absH = Math.abs(hs);
      if (absH <= tol) continue; // c on the edge's line: its triangle is degenerate
      if (count === cap) {
        cap *= 2;
        const grow = (a: Float64Array) => {
          const b = new Float64Array(cap);
          b.set(a);
          return b;
        };
        h = grow(h);
        reach = grow(reach);
        lo = grow(lo);
        hi = grow(hi);
        sign = grow(sign);
      }
      // insertion by segment distance, so the weight loop can stop at the first edge out of reach
      let slot = count++;
      while (slot > start[k] && reach[slot - 1] > segDist) {
        h[slot] = h[slot - 1];
        reach[slot] = reach[slot - 1];
        lo[slot] = lo[slot - 1];
        hi[slot] = hi[slot - 1];
        sign[slot] = sign[slot - 1];
        slot--;
      }
      h[slot] = absH;
      reach[slot] = segDist;
      lo[slot] = Math.atan(sa / absH);
      hi[slot] = Math.atan((sa + len) / absH);
      sign[slot] = hs > 0 ? 1 : -1;
    }
    bdist[k] = nearest;
    // For interior points the fan sums to exactly 2π; only a point on the boundary needs the sum itself.
    total[k] = onBoundary ? fanAngle(edges, edgeCount, cx, cy, tol) : TWO_PI;
  }
  start[n] = count;
  return { start, h, reach, lo, hi, sign, total, bdist };
}

/** Isotropic weight for point k of the precomputed data and radius r. */
export function isotropicWeightAt(data: IsotropicEdgeData, k: number, r: number): number {
  let theta = data.total[k];
  if (r <= data.bdist[k] && theta === TWO_PI) return 1;
  const { h, reach, lo, hi, sign } = data;
  for (let e = data.start[k], end = data.start[k + 1]; e < end; e++) {
    // An edge farther than r cannot cut the circle (every ray towards it meets it beyond r).
    if (reach[e] >= r) break;
    if (h[e] >= r) continue;
    const beta = Math.acos(h[e] / r);
    const a = lo[e] > -beta ? lo[e] : -beta;
    const b = hi[e] < beta ? hi[e] : beta;
    if (b > a) theta -= sign[e] * (b - a);
  }
  if (!(theta > 0)) return 100;
  const w = TWO_PI / theta;
  return w < 1 ? 1 : w > 100 ? 100 : w;
}

/**
 * Weights of every pair in `pairs`, both ways: out[2p] is w_ij (circle centred at x_i), out[2p+1] is w_ji.
 * `rmax` must be at least the largest pair distance.
 */
export function isotropicPairWeights(
  window: Window,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  n: number,
  pairs: PairList,
  rmax: number,
  out?: Float64Array,
): Float64Array {
  const data = isotropicEdgeData(window, x, y, n, rmax);
  const w = out && out.length >= 2 * pairs.count ? out : new Float64Array(2 * pairs.count);
  const { bdist, total } = data;
  const pi = pairs.i,
    pj = pairs.j,
    pd = pairs.d;
  for (let p = 0; p < pairs.count; p++) {
    const d = pd[p];
    const i = pi[p];
    const j = pj[p];
    // the common case, a circle wholly inside W, without a call
    w[2 * p] = d <= bdist[i] && total[i] === TWO_PI ? 1 : isotropicWeightAt(data, i, d);
    w[2 * p + 1] = d <= bdist[j] && total[j] === TWO_PI ? 1 : isotropicWeightAt(data, j, d);
  }
  return w;
}

/** The isotropic weight of one circle: centre (x, y) inside W, radius r > 0. */
export function isotropicWeight(window: Window, x: number, y: number, r: number): number {
  return isotropicWeightAt(isotropicEdgeData(window, [x], [y], 1, r * (1 + 1e-12) + 1e-300), 0, r);
}

/**
 * Weights for pairs between two patterns, circle centred at the pattern-a point: out[p] is w_ij for
 * a-point pairs.i[p] at distance pairs.d[p] (the convention of spatstat's Kcross).
 */
export function isotropicCrossWeights(
  window: Window,
  ax: ArrayLike<number>,
  ay: ArrayLike<number>,
  na: number,
  pairs: PairList,
  rmax: number,
  out?: Float64Array,
): Float64Array {
  const data = isotropicEdgeData(window, ax, ay, na, rmax);
  const w = out && out.length >= pairs.count ? out : new Float64Array(pairs.count);
  for (let p = 0; p < pairs.count; p++) {
    const i = pairs.i[p];
    w[p] = isotropicWeightAt(data, i, pairs.d[p]);
  }
  return w;
}
