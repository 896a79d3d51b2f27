/**
 * Pair correlation against spatstat's building blocks: the exact Epanechnikov kernel sum (half-width
 * 0.15/√λ, divisor r) with `edge.Ripley` and exact `edge.Trans` weights, computed in make-fixtures.R
 * (spatstat's own `pcf.ppp` bins the sum through an FFT density, so it is stored for information only).
 * Fixtures: trench-*.json; relative 1e-6.
 */
import { describe, it } from "vitest";
import { createWindow, pairCorrelation } from "@/lib/spatial";
import { expectClose, expectCurve, fixtureFiles, loadFixture, source } from "./fixture";

describe.each(fixtureFiles("trench-"))("spatstat pair-correlation reference %s", (file) => {
  const fx = loadFixture(file);
  const W = createWindow({ outer: fx.window.outer, holes: fx.window.holes });
  const pcf = fx.pcf!;

  it("has the exact-kernel g with isotropic and translation weights", () => {
    // fx.r starts at 0, where g is undefined; the engine drops it and spatstat's value there is null.
    const res = pairCorrelation(
      W,
      { x: fx.points.x, y: fx.points.y },
      { r: fx.r, correction: ["isotropic", "translation"] },
    );
    expectClose(res.halfWidth, pcf.h, source(fx, "h = 0.15 / sqrt(npoints(X) / area(Window(X)))"));
    expectCurve(res.g.isotropic!, pcf.isoExact.slice(1), source(fx, pcf.callExact + " [wIso]"));
    expectCurve(res.g.translation!, pcf.transExact.slice(1), source(fx, pcf.callExact + " [wTrans]"));
  });
});
