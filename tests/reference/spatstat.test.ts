/**
 * The engine against R's spatstat: deterministic quantities in an invented L-shaped trench (and the same
 * trench with a baulk left standing), to a relative 1e-6. Fixtures: tests/reference/fixtures/trench-*.json,
 * written by make-fixtures.R; each expectation's label names spatstat's version, the file and the call.
 */
import { describe, expect, it } from "vitest";
import { kFunction, lFunction, nearestNeighbourDistances, defaultRGrid } from "@/lib/spatial";
import { expectClose, expectCurve, fixtureFiles, loadFixture, source, type Fixture } from "./fixture";
import { checkClarkEvans, windowOf } from "./check-clark-evans";

const trenchFiles = fixtureFiles("trench-");

/** The r grid up to the last value where spatstat's border estimate exists (it is NaN beyond). */
function borderGrid(fx: Fixture): { r: number[]; expected: (number | null)[] } {
  let m = fx.r.length;
  while (m > 2 && fx.K.border[m - 1] === null) m--;
  return { r: fx.r.slice(0, m), expected: fx.K.border.slice(0, m) };
}

describe.each(trenchFiles)("spatstat reference %s", (file) => {
  const fx = loadFixture(file);
  const W = windowOf(fx);
  const pts = { x: fx.points.x, y: fx.points.y };

  it("has the area and perimeter (holes included) of spatstat's owin", () => {
    expectClose(W.area, fx.area, source(fx, "area(Window(X))"));
    expectClose(W.perimeter, fx.perimeter, source(fx, "perimeter(Window(X))"));
  });

  it("has spatstat's default r grid for K", () => {
    const r = defaultRGrid(W, fx.n);
    const ref = fx.defaultR!;
    expect(r.length, source(fx, ref.call)).toBe(ref.count);
    expectClose(r[r.length - 1], ref.rmax, source(fx, ref.call));
  });

  it("has spatstat's nearest-neighbour distances", () => {
    const nn = nearestNeighbourDistances({ x: Float64Array.from(pts.x), y: Float64Array.from(pts.y) });
    expectCurve(nn, fx.nndist, source(fx, "nndist(X)"));
  });

  it("has spatstat's Clark–Evans R, z and p (no edge correction)", () => {
    checkClarkEvans(fx, W);
  });

  it("has spatstat's K with the isotropic correction", () => {
    const res = kFunction(W, pts, { r: fx.r, correction: "isotropic" });
    expectCurve(res.K.isotropic!, fx.K.iso, source(fx, fx.K.call + " $iso"));
  });

  it("has spatstat's K with the translation correction, exact polygon overlap", () => {
    const res = kFunction(W, pts, { r: fx.r, correction: "translation" });
    // reference: edge.Trans(exact = TRUE) weights summed in make-fixtures.R (spatstat's Kest would use pixels)
    expectCurve(res.K.translation!, fx.K.transExact!, source(fx, fx.K.callTransExact!));
  });

  it("has spatstat's K with the border correction", () => {
    const { r, expected } = borderGrid(fx);
    const res = kFunction(W, pts, { r, correction: "border" });
    expectCurve(res.K.border!, expected, source(fx, fx.K.call + " $border"));
  });

  it("has spatstat's L = sqrt(K/pi) for each correction", () => {
    const iso = lFunction(W, pts, { r: fx.r, correction: ["isotropic", "translation"] });
    expectCurve(iso.L.isotropic!, fx.K.L.iso, source(fx, "sqrt(Kest(..., correction = 'isotropic')$iso / pi)"));
    expectCurve(iso.L.translation!, fx.K.L.transExact!, source(fx, "sqrt(K transExact / pi)"));
    const { r } = borderGrid(fx);
    const border = lFunction(W, pts, { r, correction: "border" });
    expectCurve(
      border.L.border!,
      fx.K.L.border.slice(0, r.length),
      source(fx, "sqrt(Kest(..., correction = 'border')$border / pi)"),
    );
  });
});
