/**
 * Clark & Evans (1954, Ecology 35:445–453) aggregation index R = d̄ / E[d̄], E[d̄] = 1/(2√λ) under CSR,
 * with the normal z-test of spatstat 3.x `clarkevans.test(correction = "none")`:
 *   R = d̄·2√λ,  z = (d̄ − 1/(2√λ)) / SE,  SE = √((4 − π)|W| / (4π)) / n  (= 0.26136/√(nλ), Clark & Evans' form).
 * Donnelly's (1978, in Hodder (ed.) Simulation Methods in Archaeology) edge-corrected mean and variance
 * are given too, but they were derived for rectangles: in an irregular trench they are an approximation,
 * and the Monte Carlo test (Besag & Diggle 1977) in the window is the exact one.
 */
import jStat from "../random/jstat-typed";
import { nearestNeighbourDistances } from "../geometry/neighbours";
import { checkPattern } from "../geometry/pattern";
import type { PointsInput, Window } from "../types";

export type Alternative = "two-sided" | "clustered" | "regular";

export interface ZTest {
  /** Expected mean nearest-neighbour distance under CSR. */
  expected: number;
  se: number;
  R: number;
  z: number;
  /** p for the chosen alternative, and all three. */
  p: number;
  pTwoSided: number;
  /** Small when d̄ is below its expectation (clustering): Φ(z). */
  pClustered: number;
  /** Small when d̄ is above its expectation (even spread): 1 − Φ(z). */
  pRegular: number;
}

export interface ClarkEvansResult extends ZTest {
  n: number;
  lambda: number;
  meanNN: number;
  alternative: Alternative;
  donnelly: ZTest & { approximate: true; note: string };
}

export interface ClarkEvansOptions {
  alternative?: Alternative;
  label?: string;
}

/** √((4 − π)/(4π)) = 0.26136…, the constant of Clark & Evans (1954). */
export const CLARK_EVANS_SE_CONSTANT = Math.sqrt((4 - Math.PI) / (4 * Math.PI));

function zTest(meanNN: number, expected: number, se: number, alternative: Alternative): ZTest {
  const z = (meanNN - expected) / se;
  const pClustered = jStat.normal.cdf(z, 0, 1);
  const pRegular = 1 - pClustered;
  const pTwoSided = Math.min(1, 2 * Math.min(pClustered, pRegular));
  const p = alternative === "two-sided" ? pTwoSided : alternative === "clustered" ? pClustered : pRegular;
  return { expected, se, R: meanNN / expected, z, p, pTwoSided, pClustered, pRegular };
}

/** Mean distance from each find to its nearest neighbour, d̄. */
export function meanNearestNeighbour(window: Window, points: PointsInput): number {
  const nn = nearestNeighbourDistances(checkPattern(window, points));
  let s = 0;
  for (let k = 0; k < nn.length; k++) s += nn[k];
  return s / nn.length;
}

export function clarkEvans(window: Window, points: PointsInput, options: ClarkEvansOptions = {}): ClarkEvansResult {
  const alternative = options.alternative ?? "two-sided";
  const p = checkPattern(window, points, { label: options.label });
  const n = p.x.length;
  const nn = nearestNeighbourDistances(p);
  let sum = 0;
  for (let k = 0; k < n; k++) sum += nn[k];
  const meanNN = sum / n;
  const A = window.area;
  const P = window.perimeter;
  const lambda = n / A;
  const plain = zTest(
    meanNN,
    1 / (2 * Math.sqrt(lambda)),
    Math.sqrt(((4 - Math.PI) * A) / (4 * Math.PI)) / n,
    alternative,
  );
  // Donnelly (1978): E ≈ 0.5√(A/n) + (0.0514 + 0.041/√n)·P/n, Var ≈ 0.070·A/n² + 0.037·P·√(A/n⁵)
  const eD = 0.5 * Math.sqrt(A / n) + ((0.0514 + 0.041 / Math.sqrt(n)) * P) / n;
  const varD = (0.07 * A) / (n * n) + 0.037 * P * Math.sqrt(A / n ** 5);
  const donnelly = {
    ...zTest(meanNN, eD, Math.sqrt(varD), alternative),
    approximate: true as const,
    note: "Donnelly's correction was derived for rectangular plots; in an irregular trench it is an approximation. Use the Monte Carlo test for an exact answer.",
  };
  return { n, lambda, meanNN, alternative, ...plain, donnelly };
}
