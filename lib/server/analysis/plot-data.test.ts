import { describe, expect, test } from "vitest";
import { createWindow } from "@/lib/spatial";
import { kernelDensity } from "./plot-data";

// An L-shaped trench with a hole: the pictures must follow the clipped shape, not the bounding box.
const window = createWindow({
  outer: [
    [0, 0],
    [10, 0],
    [10, 4],
    [4, 4],
    [4, 8],
    [0, 8],
  ],
  holes: [
    [
      [1, 1],
      [1, 2],
      [2, 2],
      [2, 1],
    ],
  ],
});

function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

function pointsIn(n: number, seed: number) {
  const u = lcg(seed);
  const x: number[] = [],
    y: number[] = [];
  while (x.length < n) {
    const px = u() * 10,
      py = u() * 8;
    if (window.contains(px, py)) {
      x.push(px);
      y.push(py);
    }
  }
  return { x, y };
}

describe("the heat layer drawn from the engine's numbers", () => {
  test("the heat layer is zero outside the trench and integrates to about n inside it", () => {
    const p = pointsIn(200, 11);
    const d = kernelDensity(window, p, "c1");
    expect(Math.max(d.nx, d.ny)).toBe(60);
    let total = 0;
    d.values.forEach((v, k) => {
      const cx = d.minX + ((k % d.nx) + 0.5) * d.dx,
        cy = d.minY + (Math.floor(k / d.nx) + 0.5) * d.dy;
      if (!window.contains(cx, cy)) expect(v).toBe(0);
      total += v * d.dx * d.dy;
    });
    // Edge correction restores the mass lost over the edges: the integral over W stays near n
    // (within 10 %, the pixel grid's rounding of the edge; tolerance chosen here, not from a source).
    expect(total).toBeGreaterThan(180);
    expect(total).toBeLessThan(220);
    expect(d.bandwidth).toBeGreaterThan(0);
  });
});
