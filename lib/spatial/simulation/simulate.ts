/**
 * The null models of statistics.md, drawn from a seeded `Random`:
 * - CSR with n fixed, or with a Poisson number of points of mean λ̂|W| = n (spatstat's default);
 * - random labelling: a uniform permutation of the class labels over fixed locations (Fisher–Yates as
 *   given by Durstenfeld 1964, CACM 7:420);
 * - inhomogeneous Poisson by thinning a homogeneous process of intensity λ_max (Lewis & Shedler 1979,
 *   Naval Res. Logist. Q. 26:403–413).
 * "One class fixed" is CSR for the other class next to the fixed one and needs nothing more.
 */
import { SpatialInputError } from "../errors";
import { poissonCount } from "../random/poisson-count";
import type { Random } from "../random/random";
import type { WindowSampler } from "../random/sample-window";

/** How the number of points of a CSR simulation is chosen. */
export type CsrCount = "fixed" | "poisson";

/**
 * Number of points of one CSR simulation. Under "poisson" a draw below `minimum` is redrawn: an estimator
 * needing two points is undefined otherwise, and with n ≥ 20 that happens with probability < 1e−7.
 */
export function csrCount(mode: CsrCount, n: number, rng: Random, minimum = 2): number {
  if (mode === "fixed") return n;
  if (mode !== "poisson")
    throw new SpatialInputError(`Unknown CSR count rule "${String(mode)}"; use fixed or poisson.`);
  for (let tries = 0; tries < 10000; tries++) {
    const k = poissonCount(rng, n);
    if (k >= minimum) return k;
  }
  throw new SpatialInputError(`A Poisson pattern of mean ${n} almost never has ${minimum} points; use a fixed count.`);
}

/** Fill x, y (grown when too small) with n uniform points of the sampler's window. */
export function simulateCsr(
  sampler: WindowSampler,
  n: number,
  rng: Random,
  buffers: { x: Float64Array; y: Float64Array },
): void {
  if (buffers.x.length < n) {
    buffers.x = new Float64Array(Math.ceil(n * 1.25));
    buffers.y = new Float64Array(buffers.x.length);
  }
  sampler.fill(rng, n, buffers.x, buffers.y);
}

/** Shuffle labels[0..n-1] in place: every permutation equally likely. */
export function shuffleLabels(labels: Int32Array | Uint8Array, rng: Random): void {
  for (let k = labels.length - 1; k > 0; k--) {
    const j = rng.int(k + 1);
    const t = labels[k];
    labels[k] = labels[j];
    labels[j] = t;
  }
}

/**
 * An inhomogeneous Poisson pattern with intensity `intensity(x, y)` ≤ `lambdaMax` on W, by thinning. The
 * points are written into `buffers` (grown as needed); returns their number.
 */
export function simulateInhomogeneous(
  sampler: WindowSampler,
  intensity: (x: number, y: number) => number,
  lambdaMax: number,
  rng: Random,
  buffers: { x: Float64Array; y: Float64Array },
): number {
  if (!(lambdaMax > 0) || !Number.isFinite(lambdaMax))
    throw new SpatialInputError(`λ_max must be positive; got ${lambdaMax}.`);
  const total = poissonCount(rng, lambdaMax * sampler.window.area);
  const cx = new Float64Array(total);
  const cy = new Float64Array(total);
  sampler.fill(rng, total, cx, cy);
  if (buffers.x.length < total) {
    buffers.x = new Float64Array(total);
    buffers.y = new Float64Array(total);
  }
  let kept = 0;
  for (let k = 0; k < total; k++) {
    const lam = intensity(cx[k], cy[k]);
    if (!(lam >= 0) || lam > lambdaMax * (1 + 1e-9)) {
      throw new SpatialInputError(
        `The intensity at (${cx[k].toFixed(3)}, ${cy[k].toFixed(3)}) is ${lam}, outside [0, λ_max].`,
      );
    }
    if (rng.next() * lambdaMax < lam) {
      buffers.x[kept] = cx[k];
      buffers.y[kept] = cy[k];
      kept++;
    }
  }
  return kept;
}
