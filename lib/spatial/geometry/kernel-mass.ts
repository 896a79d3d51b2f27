/**
 * The edge factor of a Gaussian kernel: e(u) = ∫_W φ_σ(u − v) dv, the share of the kernel centred at u that
 * falls inside W (Diggle 1985, JRSS C 34:138–147; Berman & Diggle 1989). Computed for polygons with holes
 * from the same signed triangle fan as the isotropic weight (edge-isotropic.ts): in polar coordinates about
 * u, the kernel mass of the triangle (u, a, b) is (1/2π)∫ (1 − exp(−ρ(t)²/(2σ²))) dt over the wedge, with
 * ρ(t) = h / cos t the distance to the edge's line. The one-dimensional integral is done by composite
 * 8-point Gauss–Legendre quadrature (nodes from Abramowitz & Stegun 1964, Table 25.4) on panels of width
 * 2σ, so e(u) is exact to about 1e-12, far below the kernel estimate's own error.
 */
import type { Window } from "../types";

const GL_X = [0.1834346424956498, 0.525532409916329, 0.7966664774136267, 0.9602898564975363];
const GL_W = [0.362683783378362, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763];
/** Beyond 8σ the kernel's tail, exp(−32) ≈ 1e-14, is neglected. */
const REACH = 8;

/**
 * ∫ (1 − exp(−ρ²/(2σ²))) dt over the wedge of edge positions s ∈ [s0, s1] along a line at distance h,
 * written in s (t = atan(s/h), dt = h ds / (h² + s²)) so that the integrand
 * h·(1 − e^{−q})/(h² + s²), q = (h² + s²)/(2σ²), is smooth on the scale of σ even when h ≪ σ.
 * Where the line is more than 8σ away the bracket is 1 and the integral is the angle atan(s/h) itself.
 */
function wedgeMass(h: number, sigma: number, s0: number, s1: number): number {
  // beyond |s| = √((8σ)² − h²) the point on the line is more than 8σ away
  const cut = Math.sqrt(Math.max(0, REACH * REACH * sigma * sigma - h * h));
  let total = 0;
  if (s0 < -cut) total += Math.atan(Math.min(s1, -cut) / h) - Math.atan(s0 / h);
  if (s1 > cut) total += Math.atan(s1 / h) - Math.atan(Math.max(s0, cut) / h);
  const a = Math.max(s0, -cut);
  const b = Math.min(s1, cut);
  if (b <= a) return total;
  const panels = Math.max(1, Math.ceil((b - a) / (2 * sigma)));
  const width = (b - a) / panels;
  const twoVar = 2 * sigma * sigma;
  for (let p = 0; p < panels; p++) {
    const mid = a + (p + 0.5) * width;
    const half = width / 2;
    for (let k = 0; k < 4; k++) {
      const lo = mid - half * GL_X[k];
      const hi = mid + half * GL_X[k];
      const r2lo = h * h + lo * lo;
      const r2hi = h * h + hi * hi;
      // (1 − e^{−q}) via expm1 keeps precision when q is tiny
      total -= GL_W[k] * half * h * (Math.expm1(-r2lo / twoVar) / r2lo + Math.expm1(-r2hi / twoVar) / r2hi);
    }
  }
  return total;
}

/** e(u) for a Gaussian kernel of standard deviation σ; 1 when W contains the disc of radius 8σ about u. */
export function gaussianEdgeMass(window: Window, ux: number, uy: number, sigma: number): number {
  if (window.boundaryDistance(ux, uy) > 8 * sigma) return 1;
  const { edges, edgeCount } = window;
  let total = 0;
  for (let e = 0; e < edgeCount; e++) {
    const ax = edges[4 * e] - ux,
      ay = edges[4 * e + 1] - uy;
    const ex = edges[4 * e + 2] - ux - ax,
      ey = edges[4 * e + 3] - uy - ay;
    const len = Math.sqrt(ex * ex + ey * ey);
    const dirX = ex / len,
      dirY = ey / len;
    const hs = dirY * ax - dirX * ay; // positive when u is on the interior side
    const h = Math.abs(hs);
    if (h <= 1e-14 * len) continue; // u on the edge's line: degenerate triangle
    const s = ax * dirX + ay * dirY;
    const sign = hs > 0 ? 1 : -1;
    // an edge line farther than 8σ holds no kernel mass beyond its wedge: the bracket is 1 throughout
    total += sign * (h > REACH * sigma ? Math.atan((s + len) / h) - Math.atan(s / h) : wedgeMass(h, sigma, s, s + len));
  }
  const mass = total / (2 * Math.PI);
  return mass < 0 ? 0 : mass > 1 ? 1 : mass;
}
