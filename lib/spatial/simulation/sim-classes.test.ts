import { describe, expect, test } from "vitest";
import { crossK, kDifference } from "../estimators/cross-k";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { createRandom } from "../random/random";
import { defaultRGrid } from "../estimators/r-grid";
import { createWindowSampler } from "../random/sample-window";
import { fixedACurve, labellingCurve } from "./sim-classes";
import { createWindow } from "../geometry/window";

// The simulation-side estimators must give exactly the curves of cross-k.ts (checked against spatstat by
// the reference tests) on the observed pattern, or the Monte Carlo test would compare unlike things.
const win = createWindow(DEMO_TRENCH);
const n = 240;
const x = new Float64Array(n),
  y = new Float64Array(n);
createWindowSampler(win).fill(createRandom(12), n, x, y);
const labels = Array.from({ length: n }, (_, k) => k % 3); // 0 = A, 1 = B, 2 = other
const pick = (cls: number) => ({ x: x.filter((_, k) => labels[k] === cls), y: y.filter((_, k) => labels[k] === cls) });
const A = pick(0),
  B = pick(1);
const r = defaultRGrid(win, n);

function close(a: ArrayLike<number>, b: ArrayLike<number>, rel: number): void {
  expect(a.length).toBe(b.length);
  for (let k = 0; k < a.length; k++) expect(Math.abs(a[k] - b[k])).toBeLessThanOrEqual(rel * Math.abs(b[k]) + 1e-12);
}

describe("between-class curves agree with cross-k.ts", () => {
  test.each(["isotropic", "translation"] as const)("random-labelling cross-L (%s)", (correction) => {
    const out = new Float64Array(r.length);
    labellingCurve(win, r, {
      kind: "labelling",
      x: Array.from(x),
      y: Array.from(y),
      labels,
      statistic: "cross-l",
      correction,
    })(Int32Array.from(labels), out, 0);
    close(out, crossK(win, A, B, { r, correction }).L[correction]!, 1e-9);
  });

  test("random-labelling K difference (isotropic)", () => {
    const out = new Float64Array(r.length);
    labellingCurve(win, r, {
      kind: "labelling",
      x: Array.from(x),
      y: Array.from(y),
      labels,
      statistic: "k-diff",
      correction: "isotropic",
    })(Int32Array.from(labels), out, 0);
    const ref = kDifference(win, A, B, { r, correction: "isotropic" }).difference.isotropic!;
    for (let k = 0; k < r.length; k++)
      expect(Math.abs(out[k] - ref[k])).toBeLessThanOrEqual(1e-9 * (1 + Math.abs(ref[k])));
  });

  test.each(["isotropic", "translation"] as const)("class A fixed, cross-L of a B pattern (%s)", (correction) => {
    const out = new Float64Array(r.length);
    fixedACurve(win, r, {
      kind: "fixed-a",
      ax: Array.from(A.x),
      ay: Array.from(A.y),
      nB: B.x.length,
      count: "fixed",
      correction,
    })(B.x, B.y, B.x.length, out, 0);
    // isotropic: the A&S acos of the simulation loop moves L by < 1e-7 relative
    close(out, crossK(win, A, B, { r, correction }).L[correction]!, correction === "isotropic" ? 1e-7 : 1e-9);
  });
});
