import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { kinks, polygon } from "@turf/turf";
import { createWindow, rectangleWindow } from "./window";
import { SpatialInputError } from "../errors";
import { firstSelfContact } from "./ring";
import type { Ring } from "../types";

// An L-shaped trench: 10 × 4 strip plus a 4 × 6 arm. Area 40 + 24 = 64, perimeter 10+10+6+6+4+4 = 40,
// both by elementary geometry.
const ell: Ring = [
  [0, 0],
  [10, 0],
  [10, 4],
  [4, 4],
  [4, 10],
  [0, 10],
];

/** A ring written as "x y, x y, …" (NaN allowed), so that a refused outline reads on one line. */
const ringOf = (text: string): Ring =>
  text.split(",").map((pair) => pair.trim().split(/\s+/).map(Number) as [number, number]);

/** Making the window of this outline (and these holes), to be called by `expect(…).toThrow`. */
const windowOf =
  (outer: Ring | string, ...holes: (Ring | string)[]) =>
  () => {
    const ring = (r: Ring | string) => (typeof r === "string" ? ringOf(r) : r);
    return createWindow(holes.length ? { outer: ring(outer), holes: holes.map(ring) } : { outer: ring(outer) });
  };

describe("createWindow", () => {
  it("gives area and perimeter of a rectangle (a·b and 2(a+b))", () => {
    const w = rectangleWindow(1, 2, 4, 7);
    expect(w.area).toBeCloseTo(15, 12);
    expect(w.perimeter).toBeCloseTo(16, 12);
    expect(w.bbox).toEqual({ minX: 1, minY: 2, maxX: 4, maxY: 7 });
    expect(w.diameter).toBeCloseTo(Math.hypot(3, 5), 12);
  });

  it("subtracts holes from area and adds them to perimeter", () => {
    // 2 × 1 hole inside the strip of the L: area 64 − 2 = 62, perimeter 40 + 6 = 46 (elementary geometry).
    const w = createWindow({
      outer: ell,
      holes: [
        [
          [6, 1],
          [8, 1],
          [8, 2],
          [6, 2],
        ],
      ],
    });
    expect(w.area).toBeCloseTo(62, 12);
    expect(w.perimeter).toBeCloseTo(46, 12);
    expect(w.edgeCount).toBe(10);
    expect(Array.from(w.ringStart)).toEqual([0, 6, 10]);
  });

  it("normalises orientation: outer counter-clockwise, holes clockwise, whatever was drawn", () => {
    const w = createWindow({
      outer: ell.slice().reverse(),
      holes: [
        [
          [6, 1],
          [6, 2],
          [8, 2],
          [8, 1],
        ],
      ],
    });
    const signed = (r: Ring) =>
      r.reduce((s, a, k) => s + a[0] * r[(k + 1) % r.length][1] - r[(k + 1) % r.length][0] * a[1], 0);
    expect(signed(w.outer as Ring)).toBeGreaterThan(0);
    expect(signed(w.holes[0] as Ring)).toBeLessThan(0);
    expect(w.area).toBeCloseTo(62, 12);
  });

  it("keeps full precision in national-grid coordinates", () => {
    // The 10 × 4 + 4 × 6 L-shape moved to easting 451 234.5, northing 6 123 456.25: area still 64.
    const far = createWindow({ outer: ell.map(([x, y]) => [x + 451234.5, y + 6123456.25] as [number, number]) });
    expect(far.area).toBeCloseTo(64, 8);
    expect(far.perimeter).toBeCloseTo(40, 8);
  });

  it("drops a repeated closing vertex", () => {
    const w = createWindow({ outer: [...ell, [0, 0]] });
    expect(w.outer.length).toBe(6);
  });

  it("tests containment in concave outlines and holes, boundary included", () => {
    const w = createWindow({
      outer: ell,
      holes: [
        [
          [6, 1],
          [8, 1],
          [8, 2],
          [6, 2],
        ],
      ],
    });
    expect(w.contains(2, 8)).toBe(true);
    expect(w.contains(8, 8)).toBe(false); // the notch of the L
    expect(w.contains(7, 1.5)).toBe(false); // inside the hole
    expect(w.contains(9, 3)).toBe(true);
    expect(w.contains(10, 2)).toBe(true); // on the outer edge
    expect(w.contains(6, 1.5)).toBe(true); // on the hole's edge
    expect(w.contains(-0.1, 2)).toBe(false);
  });

  it("measures distance to the nearest edge of any ring", () => {
    const w = createWindow({
      outer: ell,
      holes: [
        [
          [6, 1],
          [8, 1],
          [8, 2],
          [6, 2],
        ],
      ],
    });
    expect(w.boundaryDistance(2, 7)).toBeCloseTo(2, 12);
    expect(w.boundaryDistance(7, 3)).toBeCloseTo(1, 12); // to the hole's top edge and the strip's top edge
    expect(w.boundaryDistance(3, 3)).toBeCloseTo(Math.SQRT2, 12); // to the inner corner (4, 4)
  });

  it("refuses fewer than 3 distinct vertices", () => {
    expect(windowOf("0 0, 1 1, 1 1, 0 0")).toThrow(/at least 3 distinct/);
  });

  it("refuses collinear and non-finite vertices", () => {
    expect(windowOf("0 0, 1 1, 2 2")).toThrow(/zero area/);
    expect(windowOf("0 0, 1 NaN, 2 0")).toThrow(/Vertex 2 of the outer ring/);
  });

  it("refuses a self-crossing outline (bow tie)", () => {
    const bowTie = windowOf("0 0, 2 2, 2 0, 0 2");
    expect(bowTie).toThrow(SpatialInputError);
    expect(bowTie).toThrow(/crosses or touches itself/);
  });

  it("refuses an outline that touches itself at a vertex", () => {
    // Two squares meeting at (1, 1): the figure-of-eight
    expect(windowOf("0 0, 1 0, 1 1, 2 1, 2 2, 1 2, 1 1, 0 1")).toThrow(/crosses or touches itself/);
  });

  it("refuses holes outside, crossing, or touching the outer ring", () => {
    expect(windowOf(ell, "7 7, 8 7, 8 8")).toThrow(/Hole 1 is not strictly inside/);
    expect(windowOf(ell, "9 1, 11 1, 11 2")).toThrow(/Hole 1 is not strictly inside/);
    expect(windowOf(ell, "9 1, 10 1, 10 2")).toThrow(/Hole 1 is not strictly inside/);
  });

  it("refuses overlapping or nested holes", () => {
    const h1 = "1 1, 3 1, 3 3, 1 3";
    expect(windowOf(ell, h1, "2 2, 3.5 2, 3.5 3.5")).toThrow(/Holes 1 and 2/);
    expect(windowOf(ell, h1, "1.5 1.5, 2 1.5, 2 2")).toThrow(/Holes 1 and 2/);
  });

  it("agrees with @turf/turf kinks on random quadrilaterals (outside check of the crossing rule)", () => {
    const coord = fc.integer({ min: 0, max: 100_000 }).map((v) => v / 10_000);
    fc.assert(
      fc.property(fc.array(fc.tuple(coord, coord), { minLength: 4, maxLength: 4 }), (pts) => {
        const ring = pts as Ring;
        // General position only: with three collinear vertices "touching" is a matter of convention.
        for (let i = 0; i < 4; i++) {
          const [a, b, c] = [ring[i], ring[(i + 1) % 4], ring[(i + 2) % 4]];
          fc.pre(Math.abs((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])) > 1e-3);
        }
        const turfCrossings = kinks(polygon([[...ring, ring[0]]])).features.length;
        expect(firstSelfContact(ring) !== null).toBe(turfCrossings > 0);
      }),
      { numRuns: 300 },
    );
  });
});
