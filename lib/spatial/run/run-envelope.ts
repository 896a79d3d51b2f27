/**
 * One envelope test end to end: simulate, band, global p-value, verdict and the distance ranges where the
 * observed curve leaves the pointwise band. Shared by every curve-based test of run-test.ts.
 */
import { quantileSorted } from "d3-array";
import { SpatialInputError } from "../errors";
import { definedLength } from "../estimators/k-function";
import { pointwiseEnvelope, rankForLevel, type CurveSet } from "../envelopes/envelope";
import { globalTest, type GlobalStatistic } from "../envelopes/global-test";
import { runSimulations } from "../simulation/run-simulations";
import { createRandom } from "../random/random";
import { rankEnvelope } from "../envelopes/rank-envelope";
import { STREAMS_PER_TEST, type RunContext } from "./run-context";
import type { SimSetup } from "../simulation/sim-models";

export interface Excursion {
  side: "above" | "below";
  /** First distance outside the band. */
  from: number;
  /** Distance where the curve is back inside the band (the last r when it never rejoins). */
  to: number;
  rejoins: boolean;
}

/**
 * Curves are given at every r of the grid; a value is null where it is undefined (the border-corrected
 * estimate beyond the r where no point is deep enough: a gap in the plot).
 */
export interface EnvelopeOutcome {
  statistic: GlobalStatistic | "rank";
  pValue: number;
  /** +1 when the largest deviation from the reference is upwards, −1 downwards. */
  direction: 1 | -1 | 0;
  r: number[];
  observed: (number | null)[];
  reference: (number | null)[];
  referenceKind: "theoretical" | "mean of simulations";
  band: { lo: (number | null)[]; hi: (number | null)[]; pointwiseLevel: number; rank: number };
  globalBand?: { lo: (number | null)[]; hi: (number | null)[]; level: number };
  /**
   * The distances the global test, the band and the excursions used: every r where the observed curve and
   * all simulated curves are defined (all of the grid unless the border correction cut it short).
   */
  range: { from: number; to: number; values: number; wholeGrid: boolean };
  excursions: Excursion[];
  nsim: number;
  /** The summary function the curves and the test are of. */
  fun: CurveFunction;
  /** For an L curve, the K it comes from, K = πL² (null where undefined). */
  observedK?: (number | null)[];
  /** The global test's statistic on the observed curve, and a summary of its s simulated values (MAD, DCLF). */
  global: GlobalSummary;
}

/** L: Besag's L (or cross-L); K: Ripley's K (cross-K); g: pair correlation; inhomogeneous L; K difference. */
export type CurveFunction = "L" | "K" | "g" | "inhomogeneous L" | "K difference";

export type GlobalSummary =
  | {
      statistic: GlobalStatistic;
      observed: number;
      simulated: { min: number; q1: number; median: number; mean: number; q3: number; max: number };
      /** Simulated values larger than the observed one, and at least as large (ties included): p lies between
       *  (1 + larger) / (s + 1) and (1 + atLeast) / (s + 1), ties being broken at random. */
      largerThanObserved: number;
      atLeastObserved: number;
    }
  /** The rank test has no single statistic: its p-value interval over ties of extreme rank lengths. */
  | { statistic: "rank"; pInterval: [number, number] };

export function excursions(r: Float64Array, obs: Float64Array, lo: Float64Array, hi: Float64Array): Excursion[] {
  const out: Excursion[] = [];
  let open: Excursion | null = null;
  for (let k = r[0] === 0 ? 1 : 0; k < r.length; k++) {
    const side = obs[k] > hi[k] ? "above" : obs[k] < lo[k] ? "below" : null;
    if (open && side !== open.side) {
      open.to = r[k];
      open.rejoins = true;
      out.push(open);
      open = null;
    }
    if (side && !open) open = { side, from: r[k], to: r[r.length - 1], rejoins: false };
  }
  if (open) out.push(open);
  return out;
}

/** Quantile of the sorted simulated values (never empty): d3-array's quantileSorted, R's default type 7. */
const quantile = (sorted: number[], q: number): number => quantileSorted(sorted, q) ?? Number.NaN;

function summarise(statistic: GlobalStatistic, observed: number, simulated: Float64Array): GlobalSummary {
  const sorted = Array.from(simulated).sort((a, b) => a - b);
  let sum = 0,
    atLeast = 0,
    larger = 0;
  for (const v of simulated) {
    sum += v;
    if (v >= observed) atLeast++;
    if (v > observed) larger++;
  }
  const p = (v: number) => Number(v.toPrecision(10));
  return {
    statistic,
    observed: p(observed),
    simulated: {
      min: p(sorted[0]),
      q1: p(quantile(sorted, 0.25)),
      median: p(quantile(sorted, 0.5)),
      mean: p(sum / sorted.length),
      q3: p(quantile(sorted, 0.75)),
      max: p(sorted[sorted.length - 1]),
    },
    largerThanObserved: larger,
    atLeastObserved: atLeast,
  };
}

const round = (a: ArrayLike<number>, m = a.length): (number | null)[] =>
  Array.from({ length: m }, (_, k) => (k < a.length && Number.isFinite(a[k]) ? Number(a[k].toPrecision(10)) : null));

/** The first `end` values of every curve of a set. */
function truncate(set: CurveSet, end: number): CurveSet {
  if (end === set.m) return set;
  const sims = new Float64Array(set.s * end);
  for (let i = 0; i < set.s; i++) sims.set(set.sims.subarray(i * set.m, i * set.m + end), i * end);
  return { m: end, s: set.s, sims };
}

/**
 * Grid values usable by the test: the leading values where the observed curve and every simulated one are
 * defined. Refused when that leaves fewer than two distances above 0, with a message saying whose curve
 * (the observed finds' or a simulated pattern's) stops short.
 */
function usableLength(r: Float64Array, observed: Float64Array, set: CurveSet): number {
  const first = r[0] === 0 ? 1 : 0;
  const need = first + 2;
  const refuse = (whose: string, k: number): never => {
    const upTo = k > 0 ? `only up to r = ${Number(r[k - 1].toPrecision(4))} m` : "at no distance";
    throw new SpatialInputError(
      `Border correction: the curve of ${whose} is defined ${upTo}, because no point lies deeper inside the trench; the test needs at least 2 distances above 0. Use a smaller r max or another edge correction.`,
    );
  };
  const obs = definedLength(observed);
  if (obs < Math.min(need, r.length)) refuse("the observed finds", obs);
  let end = obs;
  for (let i = 0; i < set.s; i++) {
    const len = definedLength(set.sims, i * set.m, set.m);
    if (len < Math.min(need, r.length)) refuse(`simulated pattern ${i + 1}`, len);
    end = Math.min(end, len);
  }
  return end;
}

export async function envelopeTest(
  ctx: RunContext,
  setup: SimSetup,
  observed: Float64Array,
  theory: Float64Array | undefined,
  statistic: GlobalStatistic | "rank",
  fun: CurveFunction,
): Promise<EnvelopeOutcome> {
  const { spec } = ctx;
  const r = Float64Array.from(setup.r);
  const full = await runSimulations(setup, {
    seed: spec.seed,
    streamBase: ctx.testIndex * STREAMS_PER_TEST + 1,
    nsim: spec.nsim,
    pool: ctx.pool,
    signal: ctx.signal,
    onProgress: (f) => ctx.progress(f),
  });
  const m = r.length;
  const end = usableLength(r, observed, full);
  const set = truncate(full, end);
  const rUsed = r.subarray(0, end),
    obsUsed = observed.subarray(0, end);
  const band = pointwiseEnvelope(set, rankForLevel(spec.nsim, spec.level));
  const reference = theory ? theory.subarray(0, end) : band.mean;
  let pValue: number;
  let globalBand: EnvelopeOutcome["globalBand"];
  let global: GlobalSummary;
  if (statistic === "rank") {
    const res = rankEnvelope(obsUsed, set, spec.level, [r[0] === 0 ? 1 : 0, end]);
    pValue = res.pValue;
    globalBand = { lo: round(res.lo, m), hi: round(res.hi, m), level: spec.level };
    global = { statistic: "rank", pInterval: res.pInterval };
  } else {
    const tieBreak = createRandom(spec.seed, ctx.testIndex * STREAMS_PER_TEST);
    const res = globalTest(obsUsed, set, rUsed, { statistic, theory: theory?.subarray(0, end), rng: tieBreak });
    pValue = res.pValue;
    global = summarise(statistic, res.observed, res.simulated);
  }
  let worst = 0,
    direction: 1 | -1 | 0 = 0;
  for (let k = 0; k < end; k++) {
    const e = observed[k] - reference[k];
    if (Math.abs(e) > worst) {
      worst = Math.abs(e);
      direction = e > 0 ? 1 : -1;
    }
  }
  return {
    statistic,
    pValue,
    direction,
    r: Array.from(r),
    observed: round(observed),
    reference: round(theory ?? reference, m),
    referenceKind: theory ? "theoretical" : "mean of simulations",
    band: { lo: round(band.lo, m), hi: round(band.hi, m), pointwiseLevel: band.level, rank: band.rank },
    globalBand,
    range: { from: r[0], to: r[end - 1], values: end, wholeGrid: end === m },
    excursions: excursions(rUsed, obsUsed, band.lo, band.hi),
    nsim: spec.nsim,
    fun,
    ...(fun === "L" || fun === "inhomogeneous L" ? { observedK: round(observed.map((v) => Math.PI * v * v)) } : {}),
    global,
  };
}
