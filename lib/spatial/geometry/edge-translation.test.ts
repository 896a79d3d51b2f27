import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { featureCollection, intersect, polygon } from "@turf/turf";
import { createWindow, rectangleWindow } from "./window";
import { setCovariance, translationWeight } from "./edge-translation";
import { signedArea } from "./ring";
import type { Ring } from "../types";

const ellOuter: Ring = [
  [0, 0],
  [10, 0],
  [10, 4],
  [4, 4],
  [4, 10],
  [0, 10],
];

/** Planar area of a turf (polyclip-ts) intersection: the outside check of the trapezoid formula. */
function turfOverlap(outer: Ring, holes: Ring[], dx: number, dy: number): number {
  const close = (r: Ring) => [...r, r[0]];
  const shift = (r: Ring): Ring => r.map(([x, y]) => [x + dx, y + dy]);
  const a = polygon([close(outer), ...holes.map(close)]);
  const b = polygon([close(shift(outer)), ...holes.map((h) => close(shift(h)))]);
  const hit = intersect(featureCollection([a, b]));
  if (!hit) return 0;
  const polys = hit.geometry.type === "Polygon" ? [hit.geometry.coordinates] : hit.geometry.coordinates;
  let area = 0;
  for (const rings of polys) {
    rings.forEach((ring, k) => {
      const s = Math.abs(signedArea(ring.slice(0, -1) as Ring));
      area += k === 0 ? s : -s;
    });
  }
  return area;
}

describe("translation edge weight", () => {
  it("in a rectangle is ab / ((a − |dx|)(b − |dy|)) (Ohser 1983)", () => {
    const w = rectangleWindow(0, 0, 6, 4);
    for (const [dx, dy] of [
      [1, 0],
      [0, -2],
      [2.5, 1.5],
      [-3, -0.5],
    ]) {
      expect(translationWeight(w, dx, dy)).toBeCloseTo((6 * 4) / ((6 - Math.abs(dx)) * (4 - Math.abs(dy))), 12);
    }
  });

  it("gives hand-computed overlaps of an L-shaped trench", () => {
    const ell = createWindow({ outer: ellOuter });
    expect(setCovariance(ell, 0, 0)).toBeCloseTo(64, 12); // |W|
    expect(setCovariance(ell, 1, 0)).toBeCloseTo(54, 12); // [1,10]×[0,4] ∪ [1,4]×[4,10]: 36 + 18
    expect(setCovariance(ell, 0, 5)).toBeCloseTo(20, 12); // [0,4]×[5,9] ∪ [0,4]×[9,10]: 16 + 4
    expect(setCovariance(ell, 0, -5)).toBeCloseTo(20, 12); // the set covariance is even in v
    expect(setCovariance(ell, 11, 0)).toBe(0);
  });

  it("agrees with polygon clipping (@turf/turf intersect) in a concave trench with a hole", () => {
    const holes: Ring[] = [
      [
        [6, 1],
        [8, 1],
        [8, 2.5],
        [6, 2.5],
      ],
      [
        [1, 6],
        [2, 6],
        [1.5, 8],
      ],
    ];
    const win = createWindow({ outer: ellOuter, holes });
    const v = fc.double({ min: -6, max: 6, noNaN: true, noDefaultInfinity: true });
    fc.assert(
      fc.property(v, v, (dx, dy) => {
        expect(setCovariance(win, dx, dy)).toBeCloseTo(turfOverlap(ellOuter, holes, dx, dy), 8);
      }),
      { numRuns: 100 },
    );
  });
});
