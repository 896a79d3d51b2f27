/**
 * Quadrat test, kernel intensity at the finds and inhomogeneous K against spatstat (fixtures
 * trench-*.json), to a relative 1e-6.
 *
 * Quadrat cells: spatstat clips them with polyclip, whose integer arithmetic rounds coordinates to about
 * 1e-9 of the window, so expected counts agree to ~1e-8 only; still inside 1e-6. p-values get an absolute
 * floor of 1e-12: for very clustered patterns spatstat's upper tail (e.g. 1e-36) is below what 1 − cdf
 * can represent.
 */
import { describe, expect, it } from "vitest";
import { quadratTest, intensityAtPoints, scottBandwidth, kInhom, diggleBandwidth } from "@/lib/spatial";
import { expectClose, expectCurve, fixtureFiles, loadFixture, source } from "./fixture";
import { windowOf } from "./check-clark-evans";

describe.each(fixtureFiles("trench-"))("spatstat quadrat and inhomogeneous reference %s", (file) => {
  const fx = loadFixture(file);
  const W = windowOf(fx);
  const pts = { x: fx.points.x, y: fx.points.y };
  const q = fx.quadrat!;
  const ki = fx.Kinhom!;

  it("has spatstat's quadrat X², df, two-sided p, counts and expected counts", () => {
    const res = quadratTest(W, pts, { nx: q.nx, ny: q.ny });
    const label = source(fx, q.call);
    expect(res.df, `${label}: df`).toBe(q.df);
    expect(Array.from(res.observed), `${label}: observed counts, top row first`).toEqual(q.observed);
    expectCurve(res.expected, q.expected, `${label}: expected counts`);
    expectCurve(
      Float64Array.from(res.layout.cells, (c) => c.area),
      q.tileAreas,
      `${label}: clipped cell areas`,
    );
    expectClose(res.X2, q.X2, `${label}: X2`);
    expectClose(res.p, q.p, `${label}: p`, 1e-6, 1e-12);
  });

  it("has the exact leave-one-out Gaussian kernel sum at the finds (no edge correction)", () => {
    const res = intensityAtPoints(W, pts, { sigma: ki.sigma, edge: "none", leaveOneOut: true });
    expectCurve(res.values, ki.lambdaNoEdge, source(fx, ki.lambdaNoEdgeCall));
  });

  it("has the edge-corrected ('uniform') intensity, against an exact kernel mass computed in R", () => {
    // Reference: density.ppp(edge = FALSE) sum divided by the Gaussian mass inside W from vertical slices
    // (pnorm) and integrate(); spatstat's own edge = TRUE value (ki.lambda) uses pixels, 2–4 % off here.
    const res = intensityAtPoints(W, pts, { sigma: ki.sigma, edge: "uniform", leaveOneOut: true });
    expectCurve(res.values, ki.lambdaEdgeExact, source(fx, ki.edgeMassCall));
  });

  it("has Scott's bandwidth as spatstat's bw.scott(isotropic = TRUE)", () => {
    expectClose(
      scottBandwidth({ x: Float64Array.from(pts.x), y: Float64Array.from(pts.y) }),
      ki.scott,
      source(fx, ki.scottCall),
    );
  });

  it("has spatstat's Berman–Diggle bandwidth and its criterion", () => {
    const res = diggleBandwidth(W, { x: Float64Array.from(pts.x), y: Float64Array.from(pts.y) });
    const label = source(fx, ki.diggleCall);
    // spatstat's h attribute holds σ = r/2; the engine's h holds r.
    expectCurve(
      res.h.map((h) => h / 2),
      ki.diggleH,
      `${label}: sigma grid`,
    );
    expectCurve(res.M, ki.diggleCV, `${label}: criterion M`);
    expectClose(res.sigma, ki.diggle, `${label}: sigma`);
  });

  it("has spatstat's Kinhom for the stored intensities, plain and renormalised", () => {
    const plain = kInhom(W, pts, { r: fx.r, lambda: ki.lambda, renormalise: false, correction: "isotropic" });
    expectCurve(plain.K.isotropic!, ki.iso, source(fx, ki.call));
    const renorm = kInhom(W, pts, { r: fx.r, lambda: ki.lambda, correction: "isotropic" });
    expectCurve(renorm.K.isotropic!, ki.isoRenormalised, source(fx, ki.callRenormalised));
  });
});
