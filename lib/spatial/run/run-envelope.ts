/**
 * One envelope test end to end: simulate, band, global p-value, verdict and the distance ranges where the
 * observed curve leaves the pointwise band. Shared by every curve-based test of run-test.ts.
 */
import { pointwiseEnvelope, rankForLevel } from "../envelopes/envelope";
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

export interface EnvelopeOutcome {
  statistic: GlobalStatistic | "rank";
  pValue: number;
  /** +1 when the largest deviation from the reference is upwards, −1 downwards. */
  direction: 1 | -1 | 0;
  r: number[];
  observed: number[];
  reference: number[];
  referenceKind: "theoretical" | "mean of simulations";
  band: { lo: number[]; hi: number[]; pointwiseLevel: number; rank: number };
  globalBand?: { lo: number[]; hi: number[]; level: number };
  excursions: Excursion[];
  nsim: number;
}

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

const round = (a: ArrayLike<number>): number[] => Array.from(a, (v) => Number(v.toPrecision(10)));

export async function envelopeTest(
  ctx: RunContext,
  setup: SimSetup,
  observed: Float64Array,
  theory: Float64Array | undefined,
  statistic: GlobalStatistic | "rank",
): Promise<EnvelopeOutcome> {
  const { spec } = ctx;
  const r = Float64Array.from(setup.r);
  const set = await runSimulations(setup, {
    seed: spec.seed,
    streamBase: ctx.testIndex * STREAMS_PER_TEST + 1,
    nsim: spec.nsim,
    pool: ctx.pool,
    signal: ctx.signal,
    onProgress: (f) => ctx.progress(f),
  });
  const band = pointwiseEnvelope(set, rankForLevel(spec.nsim, spec.level));
  const reference = theory ?? band.mean;
  let pValue: number;
  let globalBand: EnvelopeOutcome["globalBand"];
  if (statistic === "rank") {
    const res = rankEnvelope(observed, set, spec.level, [r[0] === 0 ? 1 : 0, r.length]);
    pValue = res.pValue;
    globalBand = { lo: round(res.lo), hi: round(res.hi), level: spec.level };
  } else {
    const tieBreak = createRandom(spec.seed, ctx.testIndex * STREAMS_PER_TEST);
    pValue = globalTest(observed, set, r, { statistic, theory, rng: tieBreak }).pValue;
  }
  let worst = 0, direction: 1 | -1 | 0 = 0;
  for (let k = 0; k < r.length; k++) {
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
    reference: round(reference),
    referenceKind: theory ? "theoretical" : "mean of simulations",
    band: { lo: round(band.lo), hi: round(band.hi), pointwiseLevel: band.level, rank: band.rank },
    globalBand,
    excursions: excursions(r, observed, band.lo, band.hi),
    nsim: spec.nsim,
  };
}
