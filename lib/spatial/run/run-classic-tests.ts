/**
 * Clark–Evans and quadrat tests inside a run. The z-tests come from clark-evans.ts and quadrat.ts; the
 * Monte Carlo versions rank the observed statistic among CSR patterns of the same n in the same window
 * (Besag & Diggle 1977, Appl. Stat. 26:327–333), which makes them exact for any trench outline:
 *   small statistic side: p = (1 + #{T_sim ≤ T_obs}) / (s + 1); large side: with ≥; two-sided: twice the
 *   smaller, at most 1.
 * For Clark–Evans T = d̄ (small: clustered); for quadrats T = X² (large: clustered), reported beside the
 * χ² p-value and used as the verdict when some expected count is below 5 (Cochran 1954).
 */
import { clarkEvans } from "../estimators/clark-evans";
import { runSimulations } from "../simulation/run-simulations";
import { nnHistogram } from "../estimators/nn-histogram";
import { createQuadratLayout, quadratChiSquare, quadratCounts, quadratTest } from "../estimators/quadrat";
import { createRandom } from "../random/random";
import { classPoints, STREAMS_PER_TEST, type RunContext } from "./run-context";
import { windowInput } from "./run-curve-tests";
import type { TestSpec } from "./run-spec";
import { verdictOf } from "./run-verdict";
import type { TestResult } from "./run-test";
import { createWindowSampler } from "../random/sample-window";
import type { Window } from "../types";

type Classic = Extract<TestSpec, { type: "clark-evans" | "quadrat" }>;
type Outcome = Omit<TestResult, "options" | "level" | "seed" | "cautions">;
type Alternative = "two-sided" | "clustered" | "regular";

/** Rank p-value; `smallMeansClustered` says which tail is the clustered one. */
export function monteCarloRankPValue(
  observed: number,
  sims: ArrayLike<number>,
  alternative: Alternative,
  smallMeansClustered: boolean,
): number {
  let below = 0,
    above = 0;
  for (let i = 0; i < sims.length; i++) {
    if (sims[i] <= observed) below++;
    if (sims[i] >= observed) above++;
  }
  const s = sims.length;
  const pLow = (1 + below) / (s + 1),
    pHigh = (1 + above) / (s + 1);
  if (alternative === "two-sided") return Math.min(1, 2 * Math.min(pLow, pHigh));
  return (alternative === "clustered") === smallMeansClustered ? pLow : pHigh;
}

async function clarkEvansTest(ctx: RunContext, t: Extract<Classic, { type: "clark-evans" }>): Promise<Outcome> {
  const p = classPoints(ctx, t.class);
  const n = p.x.length;
  const ce = clarkEvans(ctx.window, p, { alternative: t.alternative });
  const details: Record<string, unknown> = {
    R: ce.R,
    z: ce.z,
    meanNNDistance: ce.meanNN,
    expectedUnderCsr: ce.expected,
    alternative: t.alternative,
  };
  let pValue = ce.p,
    direction = ce.R < 1 ? 1 : -1,
    nsim: number | null = null;
  let test = "Clark–Evans R, z-test without edge correction (Clark & Evans 1954)";
  if (t.correction === "donnelly") {
    pValue = ce.donnelly.p;
    direction = ce.meanNN < ce.donnelly.expected ? 1 : -1;
    test = "Clark–Evans R with Donnelly's edge correction (Donnelly 1978), an approximation outside rectangles";
    Object.assign(details, {
      zDonnelly: ce.donnelly.z,
      expectedDonnelly: ce.donnelly.expected,
      note: ce.donnelly.note,
    });
  } else if (t.correction === "monte-carlo") {
    const set = await runSimulations(
      { window: windowInput(ctx.window), r: [0, 1], model: { kind: "csr-nn", n } },
      {
        seed: ctx.spec.seed,
        streamBase: ctx.testIndex * STREAMS_PER_TEST + 1,
        nsim: ctx.spec.nsim,
        pool: ctx.pool,
        signal: ctx.signal,
        onProgress: ctx.progress,
      },
    );
    const meanSim = set.sims.reduce((s, v) => s + v, 0) / set.s;
    pValue = monteCarloRankPValue(ce.meanNN, set.sims, t.alternative, true);
    direction = ce.meanNN < meanSim ? 1 : -1;
    nsim = ctx.spec.nsim;
    test = "Clark–Evans R, Monte Carlo test in the window (Besag & Diggle 1977)";
    details.meanNNDistanceUnderCsr = meanSim;
  }
  const v = verdictOf(t, pValue, ctx.spec.level, direction, test);
  return {
    type: t.type,
    test,
    null: t.correction === "monte-carlo" ? "CSR, n fixed" : "CSR",
    verdict: v.verdict,
    summary: v.summary,
    pValue,
    nsim,
    n,
    details,
    picture: { kind: "nn-histogram", ...nnHistogram(p) },
  };
}

async function quadratMonteCarlo(ctx: RunContext, n: number, nx: number, ny: number): Promise<Float64Array> {
  const layout = createQuadratLayout(ctx.window, nx, ny);
  const sampler = createWindowSampler(ctx.window);
  const x = new Float64Array(n),
    y = new Float64Array(n);
  const out = new Float64Array(ctx.spec.nsim);
  for (let s = 0; s < out.length; s++) {
    if (s % 100 === 0) {
      // let the event loop breathe (progress, cancellation) during long runs on this thread
      await new Promise<void>((resolve) => setImmediate(resolve));
      if (ctx.signal?.aborted) throw new DOMException("The simulation run was cancelled.", "AbortError");
      ctx.progress(s / out.length);
    }
    sampler.fill(createRandom(ctx.spec.seed, ctx.testIndex * STREAMS_PER_TEST + 1 + s), n, x, y);
    out[s] = quadratChiSquare(layout, quadratCounts(layout, x, y, n), n);
  }
  return out;
}

async function quadrat(ctx: RunContext, t: Extract<Classic, { type: "quadrat" }>): Promise<Outcome> {
  const p = classPoints(ctx, t.class);
  const n = p.x.length;
  const { nx, ny } = t.cellSize === undefined ? t : quadratGrid(ctx.window, t.cellSize);
  const q = quadratTest(ctx.window, p, { nx, ny, alternative: t.alternative });
  // cheap enough to run here: n uniform points and a count per simulation
  const sims = await quadratMonteCarlo(ctx, n, nx, ny);
  const pMonteCarlo = monteCarloRankPValue(q.X2, sims, t.alternative, false);
  const small = Math.min(...q.expected) < 5;
  const pValue = small ? pMonteCarlo : q.p;
  const test = small
    ? "quadrat counts, Monte Carlo X² test (some expected counts < 5)"
    : "quadrat counts, Pearson X² test (Greig-Smith 1952)";
  const v = verdictOf(t, pValue, ctx.spec.level, q.pClustered < q.pRegular ? 1 : -1, test);
  const expected = Array.from(q.expected, (e) => Number(e.toPrecision(8)));
  return {
    type: t.type,
    test,
    null: "CSR, n fixed",
    verdict: v.verdict,
    summary: v.summary,
    pValue,
    nsim: ctx.spec.nsim,
    n,
    details: {
      X2: q.X2,
      df: q.df,
      pChiSquare: q.p,
      pMonteCarlo,
      varianceMeanRatio: q.varianceMeanRatio,
      wholeCellVarianceMeanRatio: q.wholeCellVarianceMeanRatio,
      cells: q.layout.cells.length,
      observed: Array.from(q.observed),
      expected,
    },
    picture: {
      kind: "quadrat-cells",
      cells: q.layout.cells.map((c, k) => ({
        x0: c.x0,
        y0: c.y0,
        x1: c.x1,
        y1: c.y1,
        count: q.observed[k],
        expected: expected[k],
      })),
    },
  };
}

/** Quadrat grid for a cell size (m): as many equal cells across the bounding box as fit, 1 to 50 each way. */
export function quadratGrid(window: Window, cellSize: number): { nx: number; ny: number } {
  const { bbox } = window;
  const clamp = (v: number) => Math.max(1, Math.min(50, Math.round(v)));
  return { nx: clamp((bbox.maxX - bbox.minX) / cellSize), ny: clamp((bbox.maxY - bbox.minY) / cellSize) };
}

export async function classicTest(ctx: RunContext, t: Classic): Promise<Outcome> {
  return t.type === "clark-evans" ? clarkEvansTest(ctx, t) : quadrat(ctx, t);
}
