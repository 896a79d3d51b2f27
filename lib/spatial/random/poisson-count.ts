/**
 * Poisson-distributed counts from a seeded source. jstat's sampler draws from Math.random and cannot be
 * seeded, so the two published algorithms it uses are written here against a `Random`:
 * - mean < 10: Knuth's multiplication method (TAOCP vol. 2, 3.4.1);
 * - mean ≥ 10: PTRS, transformed rejection with squeeze (Hörmann 1993, Insurance: Math. & Econ. 12:39–45).
 */
import jStat from "./jstat-typed";
import { SpatialInputError } from "../errors";
import type { Random } from "./random";

export function poissonCount(rng: Random, mean: number): number {
  if (!Number.isFinite(mean) || mean < 0)
    throw new SpatialInputError(`A Poisson mean must be finite and ≥ 0; got ${mean}.`);
  if (mean === 0) return 0;
  if (mean < 10) {
    const limit = Math.exp(-mean);
    let k = 0;
    let p = rng.next();
    while (p > limit) {
      k++;
      p *= rng.next();
    }
    return k;
  }
  const slam = Math.sqrt(mean);
  const loglam = Math.log(mean);
  const b = 0.931 + 2.53 * slam;
  const a = -0.059 + 0.02483 * b;
  const invalpha = 1.1239 + 1.1328 / (b - 3.4);
  const vr = 0.9277 - 3.6224 / (b - 2);
  for (;;) {
    const u = rng.next() - 0.5;
    const v = rng.next();
    const us = 0.5 - Math.abs(u);
    const k = Math.floor(((2 * a) / us + b) * u + mean + 0.43);
    if (us >= 0.07 && v <= vr) return k;
    if (k < 0 || (us < 0.013 && v > us)) continue;
    if (Math.log(v) + Math.log(invalpha) - Math.log(a / (us * us) + b) <= -mean + k * loglam - jStat.gammaln(k + 1)) {
      return k;
    }
  }
}
