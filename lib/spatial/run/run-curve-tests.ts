/**
 * The curve-based tests of a run: L under CSR, cross-L under random labelling or with one class fixed,
 * the K difference, and the inhomogeneous L. Each builds its null model as a SimSetup, computes the
 * observed curve with the same code the simulations use, and hands both to envelopeTest.
 */
import { SpatialInputError } from "../errors";
import { checkRGrid, defaultRGrid } from "../estimators/r-grid";
import { classPoints, type RunContext } from "./run-context";
import { envelopeTest, type EnvelopeOutcome } from "./run-envelope";
import type { TestSpec } from "./run-spec";
import { fixedACurve, labellingCurve } from "../simulation/sim-classes";
import { csrLCurve } from "../simulation/sim-csr";
import type { SimModel, SimSetup } from "../simulation/sim-models";
import type { Window } from "../types";

/** The r grid of a test: the spec's own, or spatstat's default for n points. */
export function testGrid(ctx: RunContext, n: number): Float64Array {
  const r = ctx.spec.r;
  if (Array.isArray(r)) return checkRGrid(ctx.window, r);
  return defaultRGrid(ctx.window, n, { count: r?.count, rmax: r?.max });
}

const windowInput = (w: Window) => ({
  outer: w.outer.map((v) => [v[0], v[1]] as [number, number]),
  holes: w.holes.map((h) => h.map((v) => [v[0], v[1]] as [number, number])),
});

export async function lEnvelopeTest(
  ctx: RunContext,
  t: Extract<TestSpec, { type: "l-envelope" }>,
): Promise<EnvelopeOutcome> {
  const p = classPoints(ctx, t.class);
  const n = p.x.length;
  // with the border correction, L is undefined (NaN) beyond the r where no find is deep enough; the
  // global test then runs where the observed and every simulated curve are defined (run-envelope.ts)
  const r = testGrid(ctx, n);
  const observed = new Float64Array(r.length);
  csrLCurve(ctx.window, r, t.correction)(p.x, p.y, n, observed, 0);
  const model: SimModel = { kind: "csr-l", n, count: t.count, correction: t.correction };
  const setup: SimSetup = { window: windowInput(ctx.window), r: Array.from(r), model };
  return envelopeTest(ctx, setup, observed, Float64Array.from(r), t.statistic, "L");
}

/** Labels 0 = class a, 1 = class b, 2 = any other class, over all finds in scope. */
function labelsOf(ctx: RunContext, a: string, b: string): { labels: number[]; nA: number; nB: number } {
  if (a === b) throw new SpatialInputError(`Choose two different classes; both are "${a}".`);
  const labels = ctx.spec.points.map((p) => (p.cls === a ? 0 : p.cls === b ? 1 : 2));
  const nA = labels.filter((l) => l === 0).length,
    nB = labels.filter((l) => l === 1).length;
  for (const [name, count] of [
    [a, nA],
    [b, nB],
  ] as const) {
    if (count === 0) throw new SpatialInputError(`No find has class "${name}".`);
  }
  return { labels, nA, nB };
}

export async function crossLTest(ctx: RunContext, t: Extract<TestSpec, { type: "cross-l" }>): Promise<EnvelopeOutcome> {
  if (t.null === "a-fixed") {
    const A = classPoints(ctx, t.a, 1);
    const B = classPoints(ctx, t.b, 1);
    const r = testGrid(ctx, A.x.length + B.x.length);
    const model: Extract<SimModel, { kind: "fixed-a" }> = {
      kind: "fixed-a",
      ax: Array.from(A.x),
      ay: Array.from(A.y),
      nB: B.x.length,
      count: t.count,
      correction: t.correction,
      ...(t.fun === "K" && { fun: "K" }),
    };
    const observed = new Float64Array(r.length);
    fixedACurve(ctx.window, r, model)(B.x, B.y, B.x.length, observed, 0);
    // under CSR for B: L(r) = r, K(r) = πr²
    const theory = t.fun === "K" ? r.map((v) => Math.PI * v * v) : Float64Array.from(r);
    return envelopeTest(
      ctx,
      { window: windowInput(ctx.window), r: Array.from(r), model },
      observed,
      theory,
      t.statistic,
      t.fun === "K" ? "K" : "L",
    );
  }
  const all = classPoints(ctx, undefined);
  const { labels } = labelsOf(ctx, t.a, t.b);
  const r = testGrid(ctx, all.x.length);
  const model: Extract<SimModel, { kind: "labelling" }> = {
    kind: "labelling",
    x: Array.from(all.x),
    y: Array.from(all.y),
    labels,
    statistic: t.fun === "K" ? "cross-k" : "cross-l",
    correction: t.correction,
  };
  const observed = new Float64Array(r.length);
  labellingCurve(ctx.window, r, model)(Int32Array.from(labels), observed, 0);
  return envelopeTest(
    ctx,
    { window: windowInput(ctx.window), r: Array.from(r), model },
    observed,
    undefined,
    t.statistic,
    t.fun === "K" ? "K" : "L",
  );
}

export async function kDifferenceTest(
  ctx: RunContext,
  t: Extract<TestSpec, { type: "k-difference" }>,
): Promise<EnvelopeOutcome> {
  const all = classPoints(ctx, undefined);
  const { labels, nA, nB } = labelsOf(ctx, t.a, t.b);
  if (nA < 2 || nB < 2) throw new SpatialInputError("The K difference needs at least 2 finds of each class.");
  const r = testGrid(ctx, all.x.length);
  const model: Extract<SimModel, { kind: "labelling" }> = {
    kind: "labelling",
    x: Array.from(all.x),
    y: Array.from(all.y),
    labels,
    statistic: "k-diff",
    correction: t.correction,
  };
  const observed = new Float64Array(r.length);
  labellingCurve(ctx.window, r, model)(Int32Array.from(labels), observed, 0);
  return envelopeTest(
    ctx,
    { window: windowInput(ctx.window), r: Array.from(r), model },
    observed,
    undefined,
    t.statistic,
    "K difference",
  );
}

export { windowInput };
