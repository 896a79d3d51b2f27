import { describe, expect, it } from "vitest";
import { clipSquares } from "./square-grid";
import { clippedSquareShape, polygonsCentroid } from "./square-shape";
import { createWindow } from "@/lib/spatial";

/**
 * A 2 m × 2 m trench with a notch 0.2 m wide cut down from its north side to y = 1, and a hole in the
 * south-east square: the known answers below are worked by hand from these shapes.
 */
const notched = createWindow({
  outer: [
    [0, 0],
    [2, 0],
    [2, 2],
    [1.1, 2],
    [1.1, 1],
    [0.9, 1],
    [0.9, 2],
    [0, 2],
  ],
  holes: [
    [
      [1.6, 0.2],
      [1.6, 0.6],
      [1.8, 0.6],
      [1.8, 0.2],
    ],
  ],
});

describe("clippedSquareShape", () => {
  const squares = clipSquares(notched, { size: 1, originX: 0, originY: 0 });
  const shape = (label: string) =>
    clippedSquareShape(
      notched,
      squares.find((s) => s.label === label)!,
    );

  it("a whole square is itself, centred", () => {
    expect(shape("0/0")).toEqual({
      rings: [
        [
          [0, 0],
          [1, 0],
          [1, 1],
          [0, 1],
        ],
      ],
      centroid: [0.5, 0.5],
    });
  });

  it("a square the notch cuts: its clipped rectangle and that rectangle's centre", () => {
    // 0/1 keeps [0, 0.9] × [1, 2]: centroid (0.45, 1.5). 1/1 keeps [1.1, 2] × [1, 2]: (1.55, 1.5).
    const tl = shape("0/1");
    expect(tl.centroid[0]).toBeCloseTo(0.45, 12);
    expect(tl.centroid[1]).toBeCloseTo(1.5, 12);
    const xs = tl.rings.flat().map((p) => p[0]);
    expect(Math.max(...xs)).toBeCloseTo(0.9, 12);
    const tr = shape("1/1");
    expect(tr.centroid[0]).toBeCloseTo(1.55, 12);
    expect(tr.centroid[1]).toBeCloseTo(1.5, 12);
  });

  it("a square with a hole: the hole is a ring of the shape and pulls the centroid away from it", () => {
    // [1,2]×[0,1] less [1.6,1.8]×[0.2,0.6]: area 1 − 0.08; x̄ = (1.5·1 − 1.7·0.08) / 0.92, ȳ = (0.5·1 − 0.4·0.08) /
    // 0.92.
    const s = shape("1/0");
    expect(s.rings).toHaveLength(2);
    expect(s.centroid[0]).toBeCloseTo((1.5 - 1.7 * 0.08) / 0.92, 12);
    expect(s.centroid[1]).toBeCloseTo((0.5 - 0.4 * 0.08) / 0.92, 12);
    expect(squares.find((q) => q.label === "1/0")!.area).toBeCloseTo(0.92, 12);
  });

  it("centroid of polygons whichever way their rings wind", () => {
    const cw: [number, number][] = [
      [0, 0],
      [0, 2],
      [4, 2],
      [4, 0],
    ];
    expect(polygonsCentroid([[cw]])).toEqual([2, 1]);
    expect(polygonsCentroid([[[...cw].reverse()]])).toEqual([2, 1]);
  });
});
