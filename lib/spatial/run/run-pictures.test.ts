/** The pictures a run gives beside tests without curves: the NN histogram and the quadrat cells in place. */
import { describe, expect, test } from "vitest";
import { nnHistogram } from "../estimators/nn-histogram";
import { createWindow } from "../geometry/window";
import { runDistributionTest } from "./run-test";

// An L-shaped trench with a hole: the pictures must follow the clipped shape, not the bounding box.
const outer: [number, number][] = [
  [0, 0],
  [10, 0],
  [10, 4],
  [4, 4],
  [4, 8],
  [0, 8],
];
const hole: [number, number][] = [
  [1, 1],
  [1, 2],
  [2, 2],
  [2, 1],
];
const window = createWindow({ outer, holes: [hole] });

function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

function pointsIn(n: number, seed: number) {
  const u = lcg(seed);
  const out: { x: number; y: number }[] = [];
  while (out.length < n) {
    const x = u() * 10,
      y = u() * 8;
    if (window.contains(x, y)) out.push({ x, y });
  }
  return out;
}

describe("pictures of the tests without curves", () => {
  test("quadrat cells carry the test's observed and expected counts on its clipped cells", async () => {
    const points = pointsIn(120, 7);
    const res = await runDistributionTest({
      window: { outer, holes: [hole] },
      points,
      nsim: 19,
      seed: 1,
      workers: 0,
      tests: [{ type: "quadrat", nx: 5, ny: 4 }],
    });
    const t = res.results[0]!;
    if (t.picture?.kind !== "quadrat-cells") throw new Error("no quadrat cells");
    const cells = t.picture.cells;
    expect(cells.map((c) => c.count)).toEqual(t.details.observed);
    expect(cells.map((c) => c.expected)).toEqual(t.details.expected);
    expect(cells.reduce((s, c) => s + c.count, 0)).toBe(120);
    expect(cells.reduce((s, c) => s + c.expected, 0)).toBeCloseTo(120, 6);
    // every find is counted in the cell that holds it
    for (const c of cells) {
      const inside = points.filter((p) => p.x > c.x0 && p.x <= c.x1 && p.y > c.y0 && p.y <= c.y1).length;
      expect(c.count).toBe(inside);
    }
    // no cell lies wholly outside the L (the top-right block is cut away)
    expect(cells.some((c) => c.x0 >= 4 && c.y0 >= 4)).toBe(false);
  });

  test("Clark–Evans carries the histogram of the class's nearest-neighbour distances", async () => {
    const points = pointsIn(60, 3);
    const res = await runDistributionTest({
      window: { outer, holes: [hole] },
      points: [...points.map((p) => ({ ...p, cls: "A" })), { x: 9, y: 1, cls: "B" }, { x: 9.5, y: 1, cls: "B" }],
      nsim: 19,
      seed: 1,
      workers: 0,
      tests: [{ type: "clark-evans", class: "A" }],
    });
    const own = nnHistogram({ x: Float64Array.from(points, (p) => p.x), y: Float64Array.from(points, (p) => p.y) });
    expect(res.results[0]!.picture).toEqual({ kind: "nn-histogram", ...own });
  });
});
