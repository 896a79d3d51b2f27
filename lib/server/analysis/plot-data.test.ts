import { describe, expect, test } from "vitest";
import { createWindow, quadratTest } from "@/lib/spatial";
import { kernelDensity, quadratCellsOf } from "./plot-data";

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

describe("pictures drawn from the engine's numbers", () => {
  test("quadrat cells carry the engine's observed and expected counts on its clipped cells", () => {
    const p = pointsIn(120, 7);
    const q = quadratTest(window, p, { nx: 5, ny: 4 });
    const cells = quadratCellsOf(window, 5, 4, Array.from(q.observed), Array.from(q.expected));
    expect(cells).toHaveLength(q.layout.cells.length);
    expect(cells.reduce((s, c) => s + c.count, 0)).toBe(120);
    expect(cells.reduce((s, c) => s + c.expected, 0)).toBeCloseTo(120, 9);
    // every find is counted in the cell that holds it
    for (const c of cells) {
      const inside = p.x.filter((x, k) => x > c.x0 && x <= c.x1 && p.y[k]! > c.y0 && p.y[k]! <= c.y1).length;
      expect(c.count).toBe(inside);
    }
    // no cell lies wholly outside the L (the top-right block is cut away)
    expect(cells.some((c) => c.x0 >= 4 && c.y0 >= 4)).toBe(false);
  });

  test("a count list that does not fit the cells is refused, not drawn shifted", () => {
    expect(() => quadratCellsOf(window, 5, 4, [1, 2, 3], [1, 2, 3])).toThrow(/3 counts for \d+ cells/);
  });

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
