/**
 * Berman–Diggle cross-validation for the bandwidth of a kernel intensity (Diggle 1985, JRSS C 34:138–147;
 * Berman & Diggle 1989, JRSS B 51:81–92), as spatstat 3.x `bw.diggle` computes it. With a disc kernel of
 * radius h the mean squared error of λ̂, up to a constant, is
 *   M(h) = (1/λ − 2K(h)) / (πh²) + J(h) / (πh²)²,  J(h) = ∫_0^{2h} φ(t, h) dK(t),
 *   φ(t, h) = 2h²·(acos(y) − y√(1 − y²)), y = t/(2h)   (the area shared by two discs of radius h at distance t),
 * minimised over the r grid up to half of r max; the Gaussian σ is then h/2, spatstat's convention. K is
 * the isotropic estimate on 512 values up to the default r max (spatstat's "good" correction below 1000
 * points; Loamwork keeps isotropic at every n, its exact and fast correction).
 */
import { kFunction } from "./k-function";
import { defaultRMax } from "./r-grid";
import { SpatialInputError } from "../errors";
import type { Points, Window } from "../types";

export interface DiggleBandwidth {
  sigma: number;
  /** The criterion M on the grid of h values (M[0] is +∞), for a plot. */
  h: Float64Array;
  M: Float64Array;
  /** The minimum fell on the last h: a wider range might give a larger σ. */
  atEdge: boolean;
}

export function diggleBandwidth(window: Window, p: Points, count = 512): DiggleBandwidth {
  const n = p.x.length;
  const lambda = n / window.area;
  const rmax = defaultRMax(window, n);
  const r = Float64Array.from({ length: count }, (_, k) => (rmax * k) / (count - 1));
  const K = kFunction(window, p, { r, correction: "isotropic" }).K.isotropic!;
  const half = rmax / 2;
  let usable = 0;
  while (usable < count && r[usable] <= half) usable++;
  const M = new Float64Array(usable);
  M[0] = Infinity;
  let best = -1;
  for (let i = 1; i < usable; i++) {
    const twoR = 2 * r[i];
    let integral = 0;
    // Stieltjes sum over the increments of K, evaluated at the left end of each step
    for (let j = 0; j < count - 1; j++) {
      const y = r[j] / twoR;
      if (y >= 1) break;
      integral += (Math.acos(y) - y * Math.sqrt(1 - y * y)) * (K[j + 1] - K[j]);
    }
    const J = 2 * r[i] * r[i] * integral;
    const area = Math.PI * r[i] * r[i];
    M[i] = (1 / lambda - 2 * K[i]) / area + J / (area * area);
    if (best < 0 || M[i] < M[best]) best = i;
  }
  if (best < 0)
    throw new SpatialInputError("Diggle's bandwidth needs a longer distance grid; too few finds to choose σ.");
  return { sigma: r[best] / 2, h: r.slice(0, usable), M, atEdge: best === usable - 1 };
}
