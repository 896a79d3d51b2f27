/**
 * Clark–Evans and quadrat tests inside a run. The Monte Carlo Clark–Evans test (Besag & Diggle 1977,
 * Appl. Stat. 26:327–333) ranks the observed mean nearest-neighbour distance d̄ among d̄ of CSR patterns
 * of the same n in the same window, which makes it exact for any trench outline:
 *   clustered: p = (1 + #{d̄_sim ≤ d̄_obs}) / (s + 1); regular: with ≥; two-sided: twice the smaller, at most 1.
 * R = d̄ · 2√λ (Clark & Evans 1954) is reported beside it.
 */
import { SpatialInputError } from "./errors";
import { nearestNeighbourDistances } from "./neighbours";
import { runSimulations } from "./pool";
import { classPoints, STREAMS_PER_TEST, type RunContext } from "./run-context";
import { windowInput } from "./run-curve-tests";
import type { TestSpec } from "./run-spec";
import { verdictOf } from "./run-verdict";
import type { TestResult } from "./run-test";

type Classic = Extract<TestSpec, { type: "clark-evans" | "quadrat" }>;
type Outcome = Omit<TestResult, "options" | "level" | "seed" | "cautions">;

export function monteCarloNNPValue(observed: number, sims: ArrayLike<number>, alternative: "two-sided" | "clustered" | "regular"): number {
  let below = 0, above = 0;
  for (let i = 0; i < sims.length; i++) {
    if (sims[i] <= observed) below++;
    if (sims[i] >= observed) above++;
  }
  const s = sims.length;
  const pLow = (1 + below) / (s + 1), pHigh = (1 + above) / (s + 1);
  if (alternative === "clustered") return pLow;
  if (alternative === "regular") return pHigh;
  return Math.min(1, 2 * Math.min(pLow, pHigh));
}

async function clarkEvansMonteCarlo(ctx: RunContext, t: Extract<Classic, { type: "clark-evans" }>): Promise<Outcome> {
  const p = classPoints(ctx, t.class);
  const n = p.x.length;
  const nn = nearestNeighbourDistances(p);
  const dbar = nn.reduce((s, v) => s + v, 0) / n;
  const lambda = n / ctx.window.area;
  const R = dbar * 2 * Math.sqrt(lambda);
  const set = await runSimulations(
    { window: windowInput(ctx.window), r: [0, 1], model: { kind: "csr-nn", n } },
    { seed: ctx.spec.seed, streamBase: ctx.testIndex * STREAMS_PER_TEST + 1, nsim: ctx.spec.nsim, pool: ctx.pool, signal: ctx.signal, onProgress: ctx.progress },
  );
  const pValue = monteCarloNNPValue(dbar, set.sims, t.alternative);
  const meanSim = set.sims.reduce((s, v) => s + v, 0) / set.s;
  const v = verdictOf(t, pValue, ctx.spec.level, dbar < meanSim ? 1 : -1);
  return {
    type: t.type,
    test: "Clark–Evans R, Monte Carlo test in the window (Besag & Diggle 1977)",
    null: "CSR, n fixed",
    verdict: v.verdict,
    summary: v.summary,
    pValue,
    nsim: ctx.spec.nsim,
    n,
    details: { R, meanNNDistance: dbar, meanNNDistanceUnderCsr: meanSim, alternative: t.alternative },
  };
}

export async function classicTest(ctx: RunContext, t: Classic): Promise<Outcome> {
  if (t.type === "clark-evans" && t.correction === "monte-carlo") return clarkEvansMonteCarlo(ctx, t);
  throw new SpatialInputError(`The ${t.type} test${t.type === "clark-evans" ? ` with correction "${t.correction}"` : ""} is not available in this engine build yet.`);
}
