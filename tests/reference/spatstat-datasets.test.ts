/**
 * Open datasets shipped with spatstat.data, each cited from its own published source (the fixture's
 * meta.source, repeated below): the engine's K (isotropic and border) on spatstat's r grid 0..0.25 to a
 * relative 1e-6, nearest-neighbour distances, and the verdict direction of the reference.
 *   cells — Crick & Ripley, in Ripley (1977) JRSS B 39:172–212: regular.
 *   redwood — Strauss (1975) Biometrika 62:467–475, subset of Ripley (1977): clustered.
 *   japanesepines — Numata (1961), as in Diggle (2003): no evidence against CSR.
 *   amacrine — Diggle (1986) J. Neurosci. Meth. 18:115–125: two types (on/off).
 */
import { describe, expect, it } from "vitest";
import { clarkEvans, kFunction, nearestNeighbourDistances } from "@/lib/spatial";
import { expectCurve, fixtureFiles, loadFixture, source } from "./fixture";
import { checkClarkEvans, windowOf } from "./check-clark-evans";

/** Verdict at the 5 % level from a two-sided Clark–Evans test (common practice). */
function verdict(R: number, p: number): string {
  return p >= 0.05 ? "random" : R < 1 ? "clustered" : "regular";
}

const EXPECTED: Record<string, string> = { cells: "regular", redwood: "clustered", japanesepines: "random" };

describe.each(fixtureFiles("dataset-"))("spatstat.data reference %s", (file) => {
  const fx = loadFixture(file);
  const W = windowOf(fx);
  const pts = { x: fx.points.x, y: fx.points.y };

  it("has spatstat's nearest-neighbour distances", () => {
    const nn = nearestNeighbourDistances({ x: Float64Array.from(pts.x), y: Float64Array.from(pts.y) });
    expectCurve(nn, fx.nndist, source(fx, "nndist(X)"));
  });

  it("has spatstat's K with the isotropic and border corrections", () => {
    const res = kFunction(W, pts, { r: fx.r, correction: ["isotropic", "border"] });
    // A pair exactly at r max (lattice coordinates: japanesepines has 6 at 0.25 in the unit square) counts in
    // spatstat's rectangle rule only when rounding puts its distance below r max (d < r max); the engine
    // takes such a distance as equal to r max in every position, so none counts. The last value is then
    // not spatstat's, and is left out of the comparison (tests/reference/README.md, known differences).
    const rmax = fx.r[fx.r.length - 1];
    let tiesAtRMax = 0;
    for (let i = 0; i < fx.points.x.length; i++) {
      for (let j = i + 1; j < fx.points.x.length; j++) {
        if (Math.abs(Math.hypot(fx.points.x[i] - fx.points.x[j], fx.points.y[i] - fx.points.y[j]) - rmax) < 1e-12)
          tiesAtRMax++;
      }
    }
    const upTo = (a: (number | null)[]) => (tiesAtRMax > 0 ? [...a.slice(0, -1), null] : a);
    expectCurve(res.K.isotropic!, upTo(fx.K.iso), source(fx, fx.K.call + " $iso"));
    expectCurve(res.K.border!, upTo(fx.K.border), source(fx, fx.K.call + " $border"));
  });

  it("has spatstat's Clark–Evans R, z and p", () => {
    checkClarkEvans(fx, W);
  });

  const expected = EXPECTED[fx.meta.dataset!];
  if (expected) {
    it(`comes out ${expected}, as the literature and spatstat say`, () => {
      // Source of the expected verdict: fixture meta.source (the dataset's published analyses) and the
      // spatstat reference's own Clark–Evans R and p in the same fixture.
      const ce = clarkEvans(W, { x: fx.points.x, y: fx.points.y });
      const label = source(fx, fx.clarkEvans.callTest);
      expect(verdict(fx.clarkEvans.R, fx.clarkEvans.pTwoSided), label).toBe(expected);
      expect(verdict(ce.R, ce.pTwoSided), label).toBe(expected);
    });
  }
});
