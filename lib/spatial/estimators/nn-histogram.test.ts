import { describe, expect, it } from "vitest";
import { SpatialInputError } from "../errors";
import { nnHistogram } from "./nn-histogram";

const pts = (x: number[], y: number[]) => ({ x: Float64Array.from(x), y: Float64Array.from(y) });

describe("nearest-neighbour histogram", () => {
  it("bins by Sturges' rule from 0 to the largest distance", () => {
    // Five finds on a line at 0, 1, 3, 6, 10: nearest neighbours 1, 1, 2, 3, 4 (worked by hand).
    // Sturges (1926): ⌈log₂ 5 + 1⌉ = ⌈3.32⌉ = 4 bins of width 4/4 = 1 m.
    const h = nnHistogram(pts([0, 1, 3, 6, 10], [0, 0, 0, 0, 0]));
    expect(h.edges).toEqual([0, 1, 2, 3, 4]);
    // 1 and 1 lie on the edge between bins 0 and 1 and count in the upper; 4 counts in the last bin.
    expect(h.counts).toEqual([0, 2, 1, 2]);
  });

  it("counts every distance once", () => {
    const x = Array.from({ length: 100 }, (_, k) => (k * 37) % 101);
    const y = Array.from({ length: 100 }, (_, k) => (k * 59) % 103);
    const h = nnHistogram(pts(x, y));
    expect(h.counts.reduce((s, c) => s + c, 0)).toBe(100);
    expect(h.counts).toHaveLength(Math.ceil(Math.log2(100) + 1)); // 8 bins
  });

  it("finds all on one spot give one bin of 1 m holding them all", () => {
    const h = nnHistogram(pts([2, 2, 2], [5, 5, 5]));
    expect(h.counts.reduce((s, c) => s + c, 0)).toBe(3);
    expect(h.edges.at(-1)).toBeCloseTo(1, 12);
    expect(h.counts[0]).toBe(3);
  });

  it("refuses fewer than two finds", () => {
    expect(() => nnHistogram(pts([1], [1]))).toThrow(SpatialInputError);
  });
});
