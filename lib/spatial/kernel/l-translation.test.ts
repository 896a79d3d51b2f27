/**
 * The simulation loop's translation-corrected K (one look-up per pair in the enumerating pass) equals
 * k-function.ts's exact estimator to 1e-9 relative, pattern after pattern, in the demo trench with its
 * baulk, a pit with many sides and a rectangle, and with trench and points shifted anywhere on the site
 * grid. Fixed seeds, bounded runs.
 */
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { createWindow } from "../geometry/window";
import { defaultRGrid } from "../estimators/r-grid";
import { kFunction, kToL } from "../estimators/k-function";
import { createRandom } from "../random/random";
import { createWindowSampler } from "../random/sample-window";
import { createTranslationL } from "./l-translation";
import { createSetCovarianceTable } from "../geometry/set-covariance-table";
import type { Ring, WindowInput } from "../types";

function pit(sides: number): WindowInput {
  const outer: Ring = [];
  for (let k = 0; k < sides; k++) {
    const a = (2 * Math.PI * k) / sides;
    const rad = 1 + 0.15 * Math.sin(3 * a) + 0.05 * Math.cos(7 * a);
    outer.push([3 + 2.2 * rad * Math.cos(a), 2 + 1.6 * rad * Math.sin(a)]);
  }
  return { outer };
}

const RECT: WindowInput = {
  outer: [
    [0, -1],
    [6, -1],
    [6, 3],
    [0, 3],
  ],
};

function shifted(input: WindowInput, sx: number, sy: number): WindowInput {
  const move = (r: Ring): Ring => r.map(([x, y]) => [x + sx, y + sy]);
  return { outer: move(input.outer), holes: (input.holes ?? []).map(move) };
}

function worstRelative(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let worst = 0;
  for (let k = 0; k < a.length; k++) {
    const scale = Math.max(Math.abs(a[k]), Math.abs(b[k]));
    if (scale > 0) worst = Math.max(worst, Math.abs(a[k] - b[k]) / scale);
  }
  return worst;
}

/** K and L of the fused estimator against kFunction(translation) for several patterns in one window. */
function compare(input: WindowInput, sizes: number[], seed: number, kernel: "wasm" | "typescript" = "wasm"): number {
  const win = createWindow(input);
  const r = defaultRGrid(win, Math.max(...sizes));
  const est = createTranslationL(win, r, undefined, { kernel })!;
  expect(est).not.toBeNull();
  const out = new Float64Array(r.length);
  const sampler = createWindowSampler(win);
  let worst = 0;
  sizes.forEach((n, k) => {
    const x = new Float64Array(n),
      y = new Float64Array(n);
    sampler.fill(createRandom(seed, k), n, x, y);
    const exact = kFunction(win, { x, y }, { r, correction: "translation" }).K.translation!;
    est.k(x, y, n, out);
    worst = Math.max(worst, worstRelative(out, exact));
    est.l(x, y, n, out);
    worst = Math.max(worst, worstRelative(out, kToL(exact)));
  });
  return worst;
}

describe("translation-corrected K in the simulation loop", () => {
  test("equals the exact estimator in the demo trench with its baulk", () => {
    // growing and shrinking patterns reuse the grid's buffers
    expect(compare(DEMO_TRENCH, [2, 300, 1000, 40, 1500], 1)).toBeLessThan(1e-9);
  });

  test("equals it with the TypeScript pass too (runtimes without WebAssembly)", () => {
    expect(compare(DEMO_TRENCH, [300, 1000], 5, "typescript")).toBeLessThan(1e-9);
  });

  test("equals it in a pit with 40 sides", () => {
    expect(compare(pit(40), [20, 500, 800], 2)).toBeLessThan(1e-9);
  });

  test("equals it in a rectangle off the origin (spatstat's rectangle binning)", () => {
    expect(compare(RECT, [50, 600], 3)).toBeLessThan(1e-9);
  });

  test("equals it with trench and points shifted anywhere on the site grid", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(0.1, 1000.37, -250.3),
        fc.constantFrom(0.1, 1000.37, 5e3 + 0.7),
        fc.constantFrom<WindowInput>(DEMO_TRENCH, pit(40), RECT),
        (sx, sy, input) => {
          expect(compare(shifted(input, sx, sy), [200], 4)).toBeLessThan(1e-9);
        },
      ),
      { seed: 11, numRuns: 6 },
    );
  });

  test("is not built where the set covariance is not prepared", () => {
    const win = createWindow(pit(40));
    const r = defaultRGrid(win, 100);
    expect(createTranslationL(win, r, createSetCovarianceTable(win, r[r.length - 1], { budget: 10 }))).toBeNull();
  });
});
