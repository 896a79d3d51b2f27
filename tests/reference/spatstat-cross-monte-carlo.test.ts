/**
 * Between-class Monte Carlo tests against spatstat (fixtures trench-*-{together,apart}.json, 199
 * simulations, isotropic correction): random labelling on cross-L and on the K difference K_AA − K_BB
 * (reference: mean of the simulations, spatstat's envelopeTest leaveout = 1), and class A fixed with B
 * replaced by uniform points (reference: the theoretical L = r). p-values within the binomial tolerance
 * of fixture.ts; with A fixed the observed MAD statistic is deterministic and checked to 1e-6.
 */
import { describe, expect, it } from "vitest";
import {
  runSimulations,
  globalTest,
  type GlobalStatistic,
  createRandom,
  fixedACurve,
  labellingCurve,
  type SimModel,
} from "@/lib/spatial";
import { classPoints, expectClose, fixtureFiles, loadFixture, pTolerance, source, type Fixture } from "./fixture";
import { windowOf } from "./check-clark-evans";

const ENGINE_NSIM = 999;
const SEED = 20261202;

interface CrossMc {
  nsim: number;
  labellingCrossL: Record<"mad" | "dclf", { statistic: number; p: number; call: string }> & { envelopeCall: string };
  labellingKDiff: Record<"mad" | "dclf", { statistic: number; p: number; call: string }> & { envelopeCall: string };
  fixedACrossL: Record<"mad" | "dclf", { statistic: number; p: number; call: string }> & { envelopeCall: string };
}

type Case = "labellingCrossL" | "labellingKDiff" | "fixedACrossL";

async function engineRun(fx: Fixture, which: Case, statistic: GlobalStatistic) {
  const W = windowOf(fx);
  const r = Float64Array.from(fx.r);
  const windowInput = { outer: fx.window.outer, holes: fx.window.holes };
  const observed = new Float64Array(r.length);
  let model: SimModel;
  if (which === "fixedACrossL") {
    const A = classPoints(fx, "A"),
      B = classPoints(fx, "B");
    model = { kind: "fixed-a", ax: A.x, ay: A.y, nB: B.x.length, count: "fixed", correction: "isotropic" };
    fixedACurve(W, r, model)(Float64Array.from(B.x), Float64Array.from(B.y), B.x.length, observed, 0);
  } else {
    const labels = fx.points.marks!.map((m) => (m === "A" ? 0 : 1));
    model = {
      kind: "labelling",
      x: fx.points.x,
      y: fx.points.y,
      labels,
      statistic: which === "labellingCrossL" ? "cross-l" : "k-diff",
      correction: "isotropic",
    };
    labellingCurve(W, r, model)(Int32Array.from(labels), observed, 0);
  }
  const set = await runSimulations(
    { window: windowInput, r: fx.r, model },
    { seed: SEED, streamBase: 0, nsim: ENGINE_NSIM },
  );
  const theory = which === "fixedACrossL" ? r : undefined;
  return globalTest(observed, set, r, { statistic, theory, rng: createRandom(SEED, 1_000_000) });
}

const files = fixtureFiles("trench-").filter((f) => /-(together|apart)\.json$/.test(f));

describe.each(files)("spatstat between-class Monte Carlo reference %s", (file) => {
  const fx = loadFixture(file);
  const mc = (fx as unknown as { crossMonteCarlo: CrossMc }).crossMonteCarlo;
  for (const which of ["labellingCrossL", "labellingKDiff", "fixedACrossL"] as const) {
    for (const statistic of ["mad", "dclf"] as const) {
      it(`${which}, ${statistic}: p agrees with spatstat within the binomial tolerance`, async () => {
        const ref = mc[which][statistic];
        const res = await engineRun(fx, which, statistic);
        const label = source(fx, `${mc[which].envelopeCall}; ${ref.call} (nsim = ${mc.nsim})`);
        if (which === "fixedACrossL" && statistic === "mad")
          expectClose(res.observed, ref.statistic, `${label}: mad statistic`);
        const tol = pTolerance(ref.p, mc.nsim, res.pValue, res.nsim);
        expect(
          Math.abs(res.pValue - ref.p),
          `${label}: engine p ${res.pValue} vs spatstat p ${ref.p}, tolerance ${tol}`,
        ).toBeLessThanOrEqual(tol);
      });
    }
  }
});
