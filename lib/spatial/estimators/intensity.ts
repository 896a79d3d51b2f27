/**
 * Kernel intensity of the finds (Diggle 1985, JRSS C 34:138–147; Silverman 1986, Density Estimation for
 * Statistics and Data Analysis): an isotropic Gaussian kernel of standard deviation σ,
 *   λ̂(u) = Σ_j φ_σ(u − x_j) / e(u)          ("uniform" edge correction, spatstat's default), or
 *   λ̂(u) = Σ_j φ_σ(u − x_j) / e(x_j)        ("diggle", Jones 1993), or no correction,
 * with e the kernel's mass inside W (kernel-mass.ts). The kernel is cut at 8σ (tail below 1e-14).
 * Bandwidth rule (default): Scott's (1992) normal-reference rule, which in two dimensions is also
 * Silverman's (1986, eq. 4.14): σ = √(s_x·s_y)·n^(−1/6), as spatstat's `bw.scott(isotropic = TRUE)`;
 * or Berman–Diggle cross-validation (Diggle 1985), as spatstat's `bw.diggle` (bandwidth.ts).
 */
import KDBush from "kdbush";
import { gaussianEdgeMass } from "../geometry/kernel-mass";
import { diggleBandwidth } from "./bandwidth";
import { checkPattern } from "../geometry/pattern";
import { SpatialInputError } from "../errors";
import type { Points, PointsInput, Window } from "../types";

export type KernelEdge = "uniform" | "diggle" | "none";

export interface IntensityOptions {
  /** σ in metres, "scott" (default) or "diggle" (Berman–Diggle cross-validation, bandwidth.ts). */
  sigma?: number | "scott" | "diggle";
  edge?: KernelEdge;
  label?: string;
}

/** Scott's rule σ = √(s_x s_y)·n^(−1/6) (sample standard deviations, n − 1 divisor). */
export function scottBandwidth(p: Points): number {
  const n = p.x.length;
  const sd = (v: Float64Array) => {
    const mean = v.reduce((s, a) => s + a, 0) / n;
    return Math.sqrt(v.reduce((s, a) => s + (a - mean) ** 2, 0) / (n - 1));
  };
  const sigma = Math.sqrt(sd(p.x) * sd(p.y)) * n ** (-1 / 6);
  if (!(sigma > 0)) {
    throw new SpatialInputError("Scott's bandwidth is 0 (the finds lie on a line); give a bandwidth in metres.");
  }
  return sigma;
}

function resolveSigma(window: Window, p: Points, sigma: IntensityOptions["sigma"]): number {
  const s =
    sigma === undefined || sigma === "scott"
      ? scottBandwidth(p)
      : sigma === "diggle"
        ? diggleBandwidth(window, p).sigma
        : sigma;
  if (!(s > 0) || !Number.isFinite(s))
    throw new SpatialInputError(`The kernel bandwidth must be a positive distance; got ${s}.`);
  return s;
}

function index(p: Points): KDBush {
  const tree = new KDBush(p.x.length, 32);
  for (let k = 0; k < p.x.length; k++) tree.add(p.x[k], p.y[k]);
  return tree.finish();
}

export interface PointIntensityOptions extends IntensityOptions {
  /** Leave x_i out of the sum at x_i (default true, as Kinhom needs: Baddeley et al. 2000). */
  leaveOneOut?: boolean;
}

export interface PointIntensity {
  sigma: number;
  edge: KernelEdge;
  leaveOneOut: boolean;
  /** λ̂(x_i), finds per m². */
  values: Float64Array;
}

/** λ̂ at each find. Refuses a result of 0 at some find (a lone find with leave-one-out and small σ). */
export function intensityAtPoints(
  window: Window,
  points: PointsInput,
  options: PointIntensityOptions = {},
): PointIntensity {
  const p = checkPattern(window, points, { label: options.label });
  const n = p.x.length;
  const sigma = resolveSigma(window, p, options.sigma);
  const edge = options.edge ?? "uniform";
  const leaveOneOut = options.leaveOneOut ?? true;
  const mass = edge === "none" ? null : Float64Array.from(p.x, (x, k) => gaussianEdgeMass(window, x, p.y[k], sigma));
  const tree = index(p);
  const norm = 1 / (2 * Math.PI * sigma * sigma);
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (const j of tree.within(p.x[i], p.y[i], 8 * sigma)) {
      if (leaveOneOut && j === i) continue;
      const dx = p.x[j] - p.x[i];
      const dy = p.y[j] - p.y[i];
      const k = norm * Math.exp(-(dx * dx + dy * dy) / (2 * sigma * sigma));
      s += edge === "diggle" ? k / Math.max(mass![j], Number.MIN_VALUE) : k;
    }
    values[i] = edge === "uniform" ? s / Math.max(mass![i], Number.MIN_VALUE) : s;
    if (!(values[i] > 0)) {
      throw new SpatialInputError(
        `The kernel intensity is 0 at find ${i + 1}: no other find lies within reach of σ = ${sigma.toPrecision(3)} m; choose a larger bandwidth.`,
      );
    }
  }
  return { sigma, edge, leaveOneOut, values };
}

export interface DensityGridOptions extends IntensityOptions {
  /** Pixels across the bounding box's width (default 128); rows follow from square pixels unless ny is given. */
  nx?: number;
  ny?: number;
}

export interface DensityGrid {
  sigma: number;
  edge: KernelEdge;
  nx: number;
  ny: number;
  /** Lower-left corner of the bounding box and the pixel size; pixel (ix, iy) is centred at x0 + (ix + ½)dx. */
  x0: number;
  y0: number;
  dx: number;
  dy: number;
  /** Row-major from the bottom row: values[iy·nx + ix], finds per m²; 0 outside W. */
  values: Float64Array;
  /** 1 where the pixel centre lies in W. */
  inside: Uint8Array;
  max: number;
}

const massCache = new WeakMap<Window, Map<string, Float64Array>>();

/**
 * e(u) at every pixel centre inside W (0 outside), cached per window, σ and grid: the heat layer is
 * redrawn for class after class in one trench, and e is most of its cost.
 */
function pixelEdgeMass(window: Window, sigma: number, nx: number, ny: number): Float64Array {
  const key = `${sigma}:${nx}:${ny}`;
  let byKey = massCache.get(window);
  const hit = byKey?.get(key);
  if (hit) return hit;
  const { bbox } = window;
  const dx = (bbox.maxX - bbox.minX) / nx;
  const dy = (bbox.maxY - bbox.minY) / ny;
  const mass = new Float64Array(nx * ny);
  for (let iy = 0; iy < ny; iy++) {
    for (let ix = 0; ix < nx; ix++) {
      const ux = bbox.minX + (ix + 0.5) * dx;
      const uy = bbox.minY + (iy + 0.5) * dy;
      if (window.contains(ux, uy)) mass[iy * nx + ix] = gaussianEdgeMass(window, ux, uy, sigma);
    }
  }
  if (!byKey) massCache.set(window, (byKey = new Map()));
  if (byKey.size > 16) byKey.clear(); // a handful of bandwidths per trench is the common case
  byKey.set(key, mass);
  return mass;
}

/** Kernel density on a pixel grid for the plan's heat layer. */
export function densityGrid(window: Window, points: PointsInput, options: DensityGridOptions = {}): DensityGrid {
  const p = checkPattern(window, points, { label: options.label, minPoints: 2 });
  const sigma = resolveSigma(window, p, options.sigma);
  const edge = options.edge ?? "uniform";
  const { bbox } = window;
  const width = bbox.maxX - bbox.minX;
  const height = bbox.maxY - bbox.minY;
  const nx = options.nx ?? 128;
  const ny = options.ny ?? Math.max(1, Math.round((nx * height) / width));
  for (const [name, v] of [
    ["nx", nx],
    ["ny", ny],
  ] as const) {
    if (!Number.isInteger(v) || v < 1 || v > 4096)
      throw new SpatialInputError(`The density grid needs 1–4096 pixels a side; ${name} = ${v}.`);
  }
  const dx = width / nx;
  const dy = height / ny;
  const n = p.x.length;
  const reach = 8 * sigma;
  const twoVar = 2 * sigma * sigma;
  const weight = Float64Array.from(p.x, (x, k) =>
    edge === "diggle" ? 1 / Math.max(gaussianEdgeMass(window, x, p.y[k], sigma), Number.MIN_VALUE) : 1,
  );
  // The Gaussian kernel factorises, φ(u − x_j) = g(u_x − x_j)·g(u_y − y_j): one row of x-factors per find,
  // then a multiply-add per pixel in reach, so no exponential is taken per pixel and find.
  const colLo = new Int32Array(n),
    colHi = new Int32Array(n);
  const xFactor: Float64Array[] = [];
  for (let j = 0; j < n; j++) {
    colLo[j] = Math.max(0, Math.ceil((p.x[j] - reach - bbox.minX) / dx - 0.5));
    colHi[j] = Math.min(nx - 1, Math.floor((p.x[j] + reach - bbox.minX) / dx - 0.5));
    const f = new Float64Array(Math.max(0, colHi[j] - colLo[j] + 1));
    for (let ix = colLo[j]; ix <= colHi[j]; ix++) {
      const ex = bbox.minX + (ix + 0.5) * dx - p.x[j];
      f[ix - colLo[j]] = Math.exp(-(ex * ex) / twoVar);
    }
    xFactor.push(f);
  }
  const norm = 1 / (2 * Math.PI * sigma * sigma);
  const values = new Float64Array(nx * ny);
  const inside = new Uint8Array(nx * ny);
  let max = 0;
  const mass = edge === "uniform" ? pixelEdgeMass(window, sigma, nx, ny) : null;
  for (let iy = 0; iy < ny; iy++) {
    const uy = bbox.minY + (iy + 0.5) * dy;
    const row = iy * nx;
    for (let j = 0; j < n; j++) {
      const ey = uy - p.y[j];
      if (ey > reach || ey < -reach) continue;
      const gy = norm * weight[j] * Math.exp(-(ey * ey) / twoVar);
      const f = xFactor[j];
      for (let ix = colLo[j], q = 0; ix <= colHi[j]; ix++, q++) values[row + ix] += gy * f[q];
    }
    for (let ix = 0; ix < nx; ix++) {
      const ux = bbox.minX + (ix + 0.5) * dx;
      if (!window.contains(ux, uy)) {
        values[row + ix] = 0;
        continue;
      }
      inside[row + ix] = 1;
      if (mass) values[row + ix] /= Math.max(mass[row + ix], Number.MIN_VALUE);
      if (values[row + ix] > max) max = values[row + ix];
    }
  }
  return { sigma, edge, nx, ny, x0: bbox.minX, y0: bbox.minY, dx, dy, values, inside, max };
}
