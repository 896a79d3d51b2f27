import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { acosAS } from "./isotropic-weights";
import { kFunction } from "../estimators/k-function";
import { createIsotropicL } from "./l-isotropic";
import { createPairScanner } from "./pair-grid";
import { pairsWithin } from "../geometry/neighbours";
import { createRandom } from "../random/random";
import { defaultRGrid } from "../estimators/r-grid";
import { createWindowSampler } from "../random/sample-window";
import { createWindow } from "../geometry/window";

const win = createWindow(DEMO_TRENCH);

function pattern(n: number, seed: number) {
  const x = new Float64Array(n),
    y = new Float64Array(n);
  createWindowSampler(win).fill(createRandom(seed), n, x, y);
  return { x, y };
}

describe("simulation-loop K (isotropic)", () => {
  test("A&S 4.4.46 acos stays within its published 2e-8 of Math.acos", () => {
    let worst = 0;
    for (let k = 0; k <= 100_000; k++) worst = Math.max(worst, Math.abs(acosAS(k / 100_000) - Math.acos(k / 100_000)));
    expect(worst).toBeLessThan(2.2e-8); // Abramowitz & Stegun (1964) 4.4.46: |ε| ≤ 2×10⁻⁸
  });

  test("agrees with the estimator of k-function.ts (Math.acos) to 1e-6 relative, finds on the edge included", () => {
    const p = pattern(300, 4);
    // three finds digitised on the trench edge and one on the baulk
    const extra = [
      [6, (0.3 * 6) / 12.1],
      [0.1, 3.9],
      [8, 1.5],
      [5.1, 6],
    ];
    const x = Float64Array.from([...p.x, ...extra.map((e) => e[0])]);
    const y = Float64Array.from([...p.y, ...extra.map((e) => e[1])]);
    const r = defaultRGrid(win, x.length);
    const ref = kFunction(win, { x, y }, { r, correction: "isotropic" }).K.isotropic!;
    const out = new Float64Array(r.length);
    createIsotropicL(win, r).k(x, y, x.length, out);
    for (let k = 1; k < r.length; k++) expect(Math.abs(out[k] - ref[k])).toBeLessThanOrEqual(1e-6 * ref[k] + 1e-12);
  });

  test("the grid scanner finds exactly the kdbush pairs", () => {
    const p = pattern(500, 8);
    const a = pairsWithin(p, 1.3);
    const b = createPairScanner(win.bbox, 1.3).within(p.x, p.y, 500);
    const key = (l: typeof a) => Array.from({ length: l.count }, (_, k) => `${l.i[k]}-${l.j[k]}`).sort();
    expect(b.count).toBe(a.count);
    expect(key(b)).toEqual(key(a));
  });

  test("K is non-decreasing in r and L(r) − r stays near 0 under CSR", () => {
    const p = pattern(1000, 2);
    const r = defaultRGrid(win, 1000);
    const out = new Float64Array(r.length);
    createIsotropicL(win, r).l(p.x, p.y, 1000, out);
    for (let k = 1; k < r.length; k++) expect(out[k]).toBeGreaterThanOrEqual(out[k - 1]);
    // common practice: for n = 1000 the CSR sd of L(r) − r at r ≈ 1–2 m is a few cm; 0.1 m is far outside
    expect(Math.abs(out[r.length - 1] - r[r.length - 1])).toBeLessThan(0.1);
  });
});
