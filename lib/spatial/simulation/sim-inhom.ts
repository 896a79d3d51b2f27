/**
 * The inhomogeneous Poisson null: patterns drawn by thinning from a pixel intensity λ(u), summarised by
 * the inhomogeneous L (Baddeley, Møller & Waagepetersen 2000, Stat. Neerl. 54:329–350):
 *   K_inhom(r) = Σ_{i≠j} w_ij 1{d_ij < r} / (λ(x_i) λ(x_j)) / Σ_i 1/λ(x_i),
 * which is spatstat's Kinhom with its default renormalisation (normpower 1; from its documentation, from
 * memory), isotropic correction. The observed pattern is read on the same pixel image, so observed and
 * simulated curves are computed alike.
 */
import { SpatialInputError } from "../errors";
import { createIsotropicL } from "../kernel/l-isotropic";
import { createWindowSampler } from "../random/sample-window";
import type { PreparedModel } from "./sim-csr";
import type { PixelIntensity } from "./sim-models";
import { simulateInhomogeneous } from "./simulate";
import type { Window } from "../types";

/** λ at (x, y): the value of the pixel containing it (edges clamped). */
export function pixelLookup(img: PixelIntensity): (x: number, y: number) => number {
  const { nx, ny, minX, minY, dx, dy, values } = img;
  if (values.length !== nx * ny)
    throw new SpatialInputError(`The intensity image has ${values.length} values for ${nx} × ${ny} pixels.`);
  for (const v of values)
    if (!(v >= 0) || !Number.isFinite(v))
      throw new SpatialInputError(`An intensity value is ${v}; it must be finite and ≥ 0.`);
  return (x, y) => {
    const i = Math.min(nx - 1, Math.max(0, Math.floor((x - minX) / dx)));
    const j = Math.min(ny - 1, Math.max(0, Math.floor((y - minY) / dy)));
    return values[j * nx + i];
  };
}

export function inhomLCurve(window: Window, r: Float64Array, img: PixelIntensity) {
  const lambda = pixelLookup(img);
  const est = createIsotropicL(window, r);
  let u = new Float64Array(0);
  return (x: Float64Array, y: Float64Array, n: number, out: Float64Array, offset: number): void => {
    if (n < 2) throw new SpatialInputError("The inhomogeneous K needs at least 2 points.");
    if (u.length < n) u = new Float64Array(n);
    let total = 0;
    for (let k = 0; k < n; k++) {
      const lam = lambda(x[k], y[k]);
      if (!(lam > 0))
        throw new SpatialInputError(
          `The intensity is 0 at find (${x[k].toFixed(3)}, ${y[k].toFixed(3)}); widen the bandwidth.`,
        );
      u[k] = 1 / lam;
      total += u[k];
    }
    const view = out.subarray(offset, offset + r.length);
    est.sums(x, y, n, view, u);
    for (let k = 0; k < r.length; k++) view[k] = Math.sqrt(view[k] / total / Math.PI);
  };
}

export function prepareInhom(window: Window, r: Float64Array, img: PixelIntensity): PreparedModel {
  const lambda = pixelLookup(img);
  const lambdaMax = Math.max(...img.values);
  const sampler = createWindowSampler(window);
  const curve = inhomLCurve(window, r, img);
  const buffers = { x: new Float64Array(0), y: new Float64Array(0) };
  return {
    m: r.length,
    simulate(rng, out, offset) {
      let n = 0;
      // A pattern with fewer than 2 points has no K; it is redrawn (rare unless the expected count is tiny).
      for (let tries = 0; n < 2; tries++) {
        if (tries === 1000) throw new SpatialInputError("The intensity surface almost never gives 2 points.");
        n = simulateInhomogeneous(sampler, lambda, lambdaMax, rng, buffers);
      }
      curve(buffers.x, buffers.y, n, out, offset);
    },
  };
}
