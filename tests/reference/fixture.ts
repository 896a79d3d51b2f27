/**
 * Loading the spatstat reference fixtures (written by make-fixtures.R) and comparing engine output with
 * them. The fixture's own `meta` block names the R and spatstat versions; `source()` builds the
 * "spatstat x.y.z (R a.b.c), file, call" label every expectation carries.
 */
import { readFileSync, readdirSync } from "node:fs";
import path from "node:path";
import { expect } from "vitest";

export type Pair = [number, number];

export interface FixtureMeta {
  generatedAt: string;
  R: string;
  packages: Record<string, string>;
  fixture: string;
  seed: number;
  source?: string;
  dataset?: string;
  datasetCall?: string;
  expectedVerdict?: string;
}

export interface McTest {
  statistic: number;
  rank: number;
  p: number;
  call: string;
}

export interface McBlock {
  nsim: number;
  seed: number;
  fixN: boolean;
  envelopeCall: string;
  mad: Record<"twoSided" | "greater" | "less", McTest>;
  dclf: Record<"twoSided" | "greater" | "less", McTest>;
}

/** Only the fields the tests read; the JSON holds more (see make-fixtures.R). */
export interface Fixture {
  file: string;
  meta: FixtureMeta;
  window: { name: string; outer: Pair[]; holes: Pair[][] };
  points: { x: number[]; y: number[]; marks?: string[] };
  n: number;
  area: number;
  perimeter: number;
  nndist: number[];
  clarkEvans: {
    R: number;
    z: number;
    pTwoSided: number;
    pClustered: number;
    pRegular: number;
    call: string;
    callTest: string;
  };
  quadrat?: {
    nx: number;
    ny: number;
    X2: number;
    df: number;
    p: number;
    observed: number[];
    expected: number[];
    tileAreas: number[];
    call: string;
  };
  r: number[];
  K: {
    iso: (number | null)[];
    border: (number | null)[];
    transExact?: number[];
    L: { iso: (number | null)[]; border: (number | null)[]; transExact?: number[] };
    call: string;
    callTransExact?: string;
  };
  pcf?: { h: number; isoExact: (number | null)[]; transExact: (number | null)[]; call: string; callExact: string };
  Kinhom?: {
    sigma: number;
    lambda: number[];
    lambdaNoEdge: number[];
    lambdaNoEdgeCall: string;
    edgeMassExact: number[];
    lambdaEdgeExact: number[];
    edgeMassCall: string;
    scott: number;
    scottCall: string;
    diggle: number;
    diggleH: number[];
    diggleCV: (number | null)[];
    diggleCall: string;
    iso: (number | null)[];
    isoRenormalised: (number | null)[];
    call: string;
    callRenormalised: string;
  };
  cross?: Record<string, (number | null)[] | string>;
  monteCarlo?: {
    poissonN: McBlock;
    fixedN?: McBlock;
    clarkEvans?: { nsim: number; seed: number; R: number; p: number; call: string };
  };
  defaultR?: { rmax: number; count: number; call: string };
}

const DIR = path.join(__dirname, "fixtures");

export function loadFixture(file: string): Fixture {
  const json = JSON.parse(readFileSync(path.join(DIR, file), "utf8")) as Omit<Fixture, "file">;
  return { ...json, file };
}

export function fixtureFiles(prefix: string): string[] {
  return readdirSync(DIR)
    .filter((f) => f.startsWith(prefix) && f.endsWith(".json"))
    .sort();
}

/** "spatstat 3.0.3 (R 4.2.2), trench-l-random.json, Kest(...)" — the source named beside an expectation. */
export function source(fx: Fixture, call: string): string {
  const r = /R version (\S+)/.exec(fx.meta.R)?.[1] ?? fx.meta.R;
  return `spatstat ${fx.meta.packages.spatstat} / spatstat.explore ${fx.meta.packages["spatstat.explore"]} (R ${r}), ${fx.file}, ${call}`;
}

export const REL = 1e-6;

/** |a − b| ≤ rel·|b| + abs: relative 1e-6, with an absolute floor for values near zero. */
export function expectClose(actual: number, expected: number, label: string, rel = REL, abs = 1e-12): void {
  const tol = rel * Math.abs(expected) + abs;
  if (!(Math.abs(actual - expected) <= tol)) {
    expect.fail(
      `${label}: engine ${actual}, reference ${expected} (difference ${actual - expected}, tolerance ${tol})`,
    );
  }
}

/** Compare a curve value by value; null in the reference (undefined in spatstat) is skipped. */
export function expectCurve(
  actual: ArrayLike<number>,
  expected: (number | null)[],
  label: string,
  rel = REL,
  abs = 1e-12,
): void {
  expect(actual.length, `${label}: length`).toBe(expected.length);
  for (let k = 0; k < expected.length; k++) {
    const e = expected[k];
    if (e === null) continue;
    expectClose(actual[k], e, `${label} at index ${k}`, rel, abs);
  }
}

/** The subset of points with one mark. */
export function classPoints(fx: Fixture, mark: string): { x: number[]; y: number[] } {
  const marks = fx.points.marks;
  if (!marks) throw new Error(`${fx.file} has no marks`);
  const x: number[] = [];
  const y: number[] = [];
  marks.forEach((m, k) => {
    if (m === mark) {
      x.push(fx.points.x[k]);
      y.push(fx.points.y[k]);
    }
  });
  return { x, y };
}

/**
 * Both p-values estimate the same true p* = P(T_sim ≥ T_obs | data). spatstat's is (1 + Bin(s_R, p*)) /
 * (s_R + 1), variance ≈ p*(1 − p*)/s_R; the engine's likewise with s_E. Their difference has standard
 * deviation σ = √(p*(1 − p*)(1/s_R + 1/s_E)), with p* estimated by pooling both. We allow 4σ (a false
 * failure about once in 16 000 checks, normal approximation) plus 1/(s_R + 1) for the "+1" of the rank
 * rule and the discreteness of the smaller run. Common practice for Monte Carlo comparisons; the bound is
 * ours. With `doubled`, p is a two-sided p formed as twice the smaller one-sided p.
 */
export function pTolerance(pR: number, sR: number, pE: number, sE: number, doubled = false): number {
  // A two-sided p = min(1, 2·min(p_low, p_high)) is twice a one-sided estimate: halve, bound, double.
  const f = doubled ? 2 : 1;
  const [a, b] = [Math.min(1, pR / f), Math.min(1, pE / f)];
  const pooled = (a * (sR + 1) + b * (sE + 1)) / (sR + sE + 2);
  const sigma = Math.sqrt(pooled * (1 - pooled) * (1 / sR + 1 / sE));
  return f * (4 * sigma + 1 / (sR + 1));
}
