/**
 * The WebAssembly translation pass gives the TypeScript pass's sums: each pair is weighed by the same
 * operations and added to the histogram in the same order, so the two agree bit for bit (held here to 1e-12
 * relative at the least), pattern after pattern, in the demo trench, a many-sided pit and the trench moved
 * on the site grid. K against kFunction is checked in l-translation.test.ts for both passes.
 */
import { describe, expect, test } from "vitest";
import { compileKernel, KERNELS } from "../../../scripts/kernel-build";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { createWindow } from "../geometry/window";
import { defaultRGrid } from "../estimators/r-grid";
import { createRandom } from "../random/random";
import { createWindowSampler } from "../random/sample-window";
import { createTranslationL } from "./l-translation";
import { TRANSLATION_SCAN_WASM } from "./translation-scan-wasm";
import type { Ring, WindowInput } from "../types";

function worstRelative(a: Float64Array, b: Float64Array): number {
  let worst = 0;
  for (let k = 0; k < a.length; k++) {
    const scale = Math.max(Math.abs(a[k]), Math.abs(b[k]));
    if (scale > 0) worst = Math.max(worst, Math.abs(a[k] - b[k]) / scale);
  }
  return worst;
}

/** K of both passes for patterns of the given sizes in one window: worst relative difference, and equal values. */
function compare(input: WindowInput, sizes: number[], seed: number, extra: [number, number][] = []) {
  const win = createWindow(input);
  const r = defaultRGrid(win, Math.max(...sizes));
  const wasm = createTranslationL(win, r)!;
  const ts = createTranslationL(win, r, undefined, { kernel: "typescript" })!;
  expect(wasm.kernel).toBe("wasm");
  expect(ts.kernel).toBe("typescript");
  const a = new Float64Array(r.length),
    b = new Float64Array(r.length);
  let worst = 0,
    equal = true;
  sizes.forEach((size, k) => {
    const n = size + extra.length;
    const x = new Float64Array(n),
      y = new Float64Array(n);
    createWindowSampler(win).fill(createRandom(seed, k), size, x, y);
    extra.forEach(([px, py], e) => {
      x[size + e] = px;
      y[size + e] = py;
    });
    const pairs = ts.k(x, y, n, b);
    expect(wasm.k(x, y, n, a)).toBe(pairs);
    expect(wasm.part(x, y, n, "count")).toBe(pairs);
    if (size >= 40) expect(a[r.length - 1]).toBeGreaterThan(0);
    worst = Math.max(worst, worstRelative(a, b));
    equal &&= a.every((v, i) => v === b[i]);
  });
  return { worst, equal };
}

function pit(sides: number): WindowInput {
  const outer: Ring = [];
  for (let k = 0; k < sides; k++) {
    const a = (2 * Math.PI * k) / sides;
    const rad = 1 + 0.15 * Math.sin(3 * a) + 0.05 * Math.cos(7 * a);
    outer.push([3 + 2.2 * rad * Math.cos(a), 2 + 1.6 * rad * Math.sin(a)]);
  }
  return { outer };
}

describe("WebAssembly translation pass", () => {
  test("runs for a polygon trench and leaves rectangles to the TypeScript pass", () => {
    const rect = createWindow({
      outer: [
        [0, 0],
        [10, 0],
        [10, 6],
        [0, 6],
      ],
    });
    expect(createTranslationL(rect, defaultRGrid(rect, 500))!.kernel).toBe("typescript");
    const win = createWindow(DEMO_TRENCH);
    expect(createTranslationL(win, defaultRGrid(win, 500))!.kernel).toBe("wasm");
  });

  test("gives the TypeScript pass's sums in the demo trench, pattern after pattern of changing size", () => {
    // growing and shrinking n exercises the re-layout of linear memory; finds on the trench edge, on the
    // baulk's corner and at the same spot make displacements on the table's case lines and axes
    const { worst, equal } = compare(DEMO_TRENCH, [40, 1000, 300, 1500, 2], 1, [
      [6, (0.3 * 6) / 12.1],
      [7, 1.5],
      [9, 2.3],
      [3, 3],
      [3, 3],
      [5, 3],
    ]);
    expect(worst).toBeLessThan(1e-12);
    expect(equal).toBe(true);
  });

  test("gives them in a pit with 40 sides, where many table cells keep listed edge pairs", () => {
    const { worst, equal } = compare(pit(40), [20, 600], 2);
    expect(worst).toBeLessThan(1e-12);
    expect(equal).toBe(true);
  });

  test("gives them with the trench far out on the site grid", () => {
    const far: WindowInput = {
      outer: DEMO_TRENCH.outer.map(([x, y]) => [x + 1000.37, y - 250.3] as [number, number]),
      holes: (DEMO_TRENCH.holes ?? []).map((h) => h.map(([x, y]) => [x + 1000.37, y - 250.3] as [number, number])),
    };
    const { worst, equal } = compare(far, [500], 3);
    expect(worst).toBeLessThan(1e-12);
    expect(equal).toBe(true);
  });

  test("the embedded binary is the one its AssemblyScript source compiles to (npm run build:kernel)", async () => {
    const binary = await compileKernel(KERNELS.translation);
    expect(Buffer.from(binary).toString("base64")).toBe(TRANSLATION_SCAN_WASM);
  });
});
