/**
 * Global MAD test on L (isotropic) against spatstat's `mad.test` / `dclf.test` p-values
 * (fixtures trench-*-{random,clustered}.json and dataset-*.json, 199 simulations each).
 *
 * The observed MAD statistic is deterministic and checked to a relative 1e-6. The p-values cannot match
 * another generator's draws; they are checked within a binomial tolerance (argued at `pTolerance`).
 */
import { describe, expect, it } from "vitest";
import {
  runSimulations,
  createWindow,
  lFunction,
  globalTest,
  type GlobalStatistic,
  createRandom,
  meanNearestNeighbour,
  monteCarloRankPValue,
  type CsrCount,
} from "@/lib/spatial";
import { expectClose, fixtureFiles, loadFixture, pTolerance, source, type Fixture, type McBlock } from "./fixture";

/** Simulations on the engine's side: more than spatstat's 199 so the engine's own noise is small. */
const ENGINE_NSIM = 999;
const SEED = 20261201;

async function engineTest(fx: Fixture, count: CsrCount, statistic: GlobalStatistic) {
  const W = createWindow({ outer: fx.window.outer, holes: fx.window.holes });
  const r = Float64Array.from(fx.r);
  const obs = lFunction(W, { x: fx.points.x, y: fx.points.y }, { r, correction: "isotropic" }).L.isotropic!;
  const set = await runSimulations(
    {
      window: { outer: fx.window.outer, holes: fx.window.holes },
      r: fx.r,
      model: { kind: "csr-l", n: fx.n, count, correction: "isotropic" },
    },
    { seed: SEED, streamBase: 0, nsim: ENGINE_NSIM },
  );
  const res = globalTest(obs, set, r, { statistic, theory: r, rng: createRandom(SEED, 1_000_000) });
  return { obs, res };
}

function checkAgainst(fx: Fixture, block: McBlock, count: CsrCount) {
  it(`MAD on L: observed statistic and p-value (${count} n) agree with spatstat`, async () => {
    const { obs, res } = await engineTest(fx, count, "mad");
    const ref = block.mad.twoSided;
    const label = source(fx, `${block.envelopeCall}; ${ref.call} (nsim = ${block.nsim}, seed ${block.seed})`);
    expectClose(res.observed, ref.statistic, `${label}: mad statistic`);
    const tol = pTolerance(ref.p, block.nsim, res.pValue, res.nsim);
    expect(
      Math.abs(res.pValue - ref.p),
      `${label}: engine p ${res.pValue} vs spatstat p ${ref.p}, tolerance ${tol}`,
    ).toBeLessThanOrEqual(tol);
    // Direction: the largest deviation of L from r has the sign spatstat's one-sided tests point to.
    let at = 0;
    for (let k = 0; k < obs.length; k++) if (Math.abs(obs[k] - fx.r[k]) > Math.abs(obs[at] - fx.r[at])) at = k;
    const above = obs[at] > fx.r[at];
    if (block.mad.greater.p <= 0.05)
      expect(above, `${label}: spatstat mad.test(alternative = 'greater') p = ${block.mad.greater.p}`).toBe(true);
    if (block.mad.less.p <= 0.05)
      expect(above, `${label}: spatstat mad.test(alternative = 'less') p = ${block.mad.less.p}`).toBe(false);
  });

  it(`DCLF on L: p-value (${count} n) agrees with spatstat`, async () => {
    const { res } = await engineTest(fx, count, "dclf");
    const ref = block.dclf.twoSided;
    const label = source(fx, `${block.envelopeCall}; ${ref.call} (nsim = ${block.nsim}, seed ${block.seed})`);
    const tol = pTolerance(ref.p, block.nsim, res.pValue, res.nsim);
    expect(
      Math.abs(res.pValue - ref.p),
      `${label}: engine p ${res.pValue} vs spatstat p ${ref.p}, tolerance ${tol}`,
    ).toBeLessThanOrEqual(tol);
  });
}

const files = [
  ...fixtureFiles("trench-").filter((f) => /-(random|clustered)\.json$/.test(f)),
  ...fixtureFiles("dataset-"),
];

describe.each(files)("spatstat Monte Carlo reference %s", (file) => {
  const fx = loadFixture(file);
  const mc = fx.monteCarlo!;
  checkAgainst(fx, mc.poissonN, "poisson");
  if (mc.fixedN) checkAgainst(fx, mc.fixedN, "fixed");

  const ce = mc.clarkEvans;
  if (ce) {
    it("Clark–Evans Monte Carlo p (n fixed, two-sided) agrees with spatstat", async () => {
      const W = createWindow({ outer: fx.window.outer, holes: fx.window.holes });
      const dbar = meanNearestNeighbour(W, { x: fx.points.x, y: fx.points.y });
      const set = await runSimulations(
        { window: { outer: fx.window.outer, holes: fx.window.holes }, r: [0, 1], model: { kind: "csr-nn", n: fx.n } },
        { seed: SEED, streamBase: 0, nsim: ENGINE_NSIM },
      );
      const p = monteCarloRankPValue(dbar, set.sims, "two-sided", true);
      const label = source(fx, `${ce.call} (nsim = ${ce.nsim})`);
      const tol = pTolerance(ce.p, ce.nsim, p, ENGINE_NSIM, true);
      expect(Math.abs(p - ce.p), `${label}: engine p ${p} vs spatstat p ${ce.p}, tolerance ${tol}`).toBeLessThanOrEqual(
        tol,
      );
    });
  }
});
