/** Shared check of the engine's Clark–Evans test against a fixture (trench and dataset tests). */
import { clarkEvans, createWindow, type Window } from "@/lib/spatial";
import { expectClose, source, type Fixture } from "./fixture";

export function windowOf(fx: Fixture): Window {
  return createWindow({ outer: fx.window.outer, holes: fx.window.holes });
}

/**
 * Clark–Evans against clarkevans() / clarkevans.test(correction = "none"). spatstat prints p as
 * 2(1 − Φ(|z|)), which underflows to 0 beyond |z| ≈ 8.3 and loses relative precision below ~1e-8, so p
 * has an absolute floor of 1e-12.
 */
export function checkClarkEvans(fx: Fixture, W: Window): void {
  const ce = clarkEvans(W, { x: fx.points.x, y: fx.points.y });
  const ref = fx.clarkEvans;
  expectClose(ce.R, ref.R, source(fx, ref.call));
  expectClose(ce.z, ref.z, source(fx, "z of " + ref.callTest + " (SE = sqrt((4 - pi) |W| / (4 pi)) / n)"));
  expectClose(ce.pTwoSided, ref.pTwoSided, source(fx, ref.callTest), 1e-6, 1e-12);
  expectClose(
    ce.pClustered,
    ref.pClustered,
    source(fx, "clarkevans.test(X, correction = 'none', alternative = 'clustered')"),
    1e-6,
    1e-12,
  );
  expectClose(
    ce.pRegular,
    ref.pRegular,
    source(fx, "clarkevans.test(X, correction = 'none', alternative = 'regular')"),
    1e-6,
    1e-12,
  );
}
