import { describe, expect, test } from "vitest";
import { compileKernel } from "../../../scripts/kernel-build";
import { DEMO_TRENCH } from "../geometry/demo-window";
import { ISOTROPIC_SCAN_WASM } from "./isotropic-scan-wasm";
import { createIsotropicL } from "./l-isotropic";
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

function worstRelative(a: Float64Array, b: Float64Array): number {
  let worst = 0;
  for (let k = 0; k < a.length; k++) worst = Math.max(worst, Math.abs(a[k] - b[k]) / Math.max(Math.abs(a[k]), 1e-300));
  return worst;
}

describe("WebAssembly isotropic scan", () => {
  test("runs for a polygon trench and leaves rectangles to the TypeScript loop", () => {
    const r = defaultRGrid(win, 500);
    expect(createIsotropicL(win, r).kernel).toBe("wasm");
    const rect = createWindow({
      outer: [
        [0, 0],
        [10, 0],
        [10, 6],
        [0, 6],
      ],
    });
    expect(createIsotropicL(rect, defaultRGrid(rect, 500)).kernel).toBe("typescript");
  });

  test("gives the TypeScript loop's sums to rounding, pattern after pattern of changing size", () => {
    const r = defaultRGrid(win, 1000);
    const wasm = createIsotropicL(win, r);
    const ts = createIsotropicL(win, r, { kernel: "typescript" });
    const a = new Float64Array(r.length),
      b = new Float64Array(r.length);
    // growing and shrinking n exercises the re-layout of linear memory
    for (const [n, seed] of [
      [40, 1],
      [1000, 2],
      [300, 3],
      [1500, 4],
      [2, 5],
    ]) {
      const p = pattern(n, seed);
      const pairs = ts.sums(p.x, p.y, n, b);
      expect(wasm.sums(p.x, p.y, n, a)).toBe(pairs);
      expect(wasm.countPairs(p.x, p.y, n)).toBe(pairs);
      expect(worstRelative(a, b)).toBeLessThan(1e-12);
      if (n >= 40) expect(a[r.length - 1]).toBeGreaterThan(0);
    }
  });

  test("weighs finds on the trench edge and the baulk, and per-point factors (inhomogeneous K)", () => {
    const p = pattern(400, 9);
    const extra = [
      [6, (0.3 * 6) / 12.1],
      [0.1, 3.9],
      [8, 1.5],
      [5.1, 6],
    ];
    const x = Float64Array.from([...p.x, ...extra.map((e) => e[0])]);
    const y = Float64Array.from([...p.y, ...extra.map((e) => e[1])]);
    const u = Float64Array.from(x, (v, k) => 0.5 + ((k * 7919) % 13) / 10);
    const r = defaultRGrid(win, x.length);
    const a = new Float64Array(r.length),
      b = new Float64Array(r.length);
    createIsotropicL(win, r).sums(x, y, x.length, a, u);
    createIsotropicL(win, r, { kernel: "typescript" }).sums(x, y, x.length, b, u);
    expect(worstRelative(a, b)).toBeLessThan(1e-12);
  });

  test("grows its memory for a many-sided outline where every find is near many edges", () => {
    // a 72-sided round pit, 1.5 m across: every find is within r max of dozens of edges
    const outer = Array.from(
      { length: 72 },
      (_, k) => [0.75 * Math.cos((k * Math.PI) / 36), 0.75 * Math.sin((k * Math.PI) / 36)] as [number, number],
    );
    const pit = createWindow({ outer });
    const x = new Float64Array(300),
      y = new Float64Array(300);
    createWindowSampler(pit).fill(createRandom(21), 300, x, y);
    const r = defaultRGrid(pit, 300);
    const a = new Float64Array(r.length),
      b = new Float64Array(r.length);
    const wasm = createIsotropicL(pit, r);
    expect(wasm.kernel).toBe("wasm");
    wasm.sums(x, y, 300, a);
    createIsotropicL(pit, r, { kernel: "typescript" }).sums(x, y, 300, b);
    expect(worstRelative(a, b)).toBeLessThan(1e-12);
  });

  test("bins an uneven r grid by spatstat's rule, distances on grid values included", () => {
    const p = pattern(600, 11);
    const r = Float64Array.from([0, 0.05, 0.1, 0.3, 0.31, 0.7, 1.0, 1.4, 1.9]);
    // a pair placed at exactly r = 0.7 and one at r max
    const x = Float64Array.from([...p.x, 3, 3.7, 3, 4.9]);
    const y = Float64Array.from([...p.y, 3, 3, 5, 5]);
    const a = new Float64Array(r.length),
      b = new Float64Array(r.length);
    createIsotropicL(win, r).sums(x, y, x.length, a);
    createIsotropicL(win, r, { kernel: "typescript" }).sums(x, y, x.length, b);
    expect(worstRelative(a, b)).toBeLessThan(1e-12);
  });

  test("the embedded binary is the one its AssemblyScript source compiles to (npm run build:kernel)", async () => {
    const binary = await compileKernel();
    expect(Buffer.from(binary).toString("base64")).toBe(ISOTROPIC_SCAN_WASM);
  });
});
