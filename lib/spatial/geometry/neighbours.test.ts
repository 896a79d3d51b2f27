import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { nearestNeighbourDistances, pairsBetween, pairsWithin } from "./neighbours";

const pattern = fc
  .array(fc.tuple(fc.integer({ min: 0, max: 2000 }), fc.integer({ min: 0, max: 1000 })), {
    minLength: 2,
    maxLength: 80,
  })
  .map((pts) => ({ x: Float64Array.from(pts, (p) => p[0] / 100), y: Float64Array.from(pts, (p) => p[1] / 100) }));

/** All-pairs enumeration: the obvious definition the fast search must agree with. */
function brute(
  a: { x: Float64Array; y: Float64Array },
  b: { x: Float64Array; y: Float64Array } | null,
  rmax: number,
): string[] {
  const out: string[] = [];
  const other = b ?? a;
  for (let i = 0; i < a.x.length; i++) {
    for (let j = b ? 0 : i + 1; j < other.x.length; j++) {
      const d = Math.hypot(other.x[j] - a.x[i], other.y[j] - a.y[i]);
      if (d <= rmax) out.push(`${i},${j},${d.toFixed(9)}`);
    }
  }
  return out.sort();
}

const list = (p: { count: number; i: Int32Array; j: Int32Array; d: Float64Array }) =>
  Array.from({ length: p.count }, (_, k) => `${p.i[k]},${p.j[k]},${p.d[k].toFixed(9)}`).sort();

describe("neighbour search", () => {
  it("pairsWithin finds exactly the pairs i < j with d ≤ rmax, each once", () => {
    fc.assert(
      fc.property(pattern, fc.double({ min: 0.05, max: 8, noNaN: true }), (p, rmax) => {
        expect(list(pairsWithin(p, rmax))).toEqual(brute(p, null, rmax));
      }),
      { numRuns: 150 },
    );
  });

  it("pairsBetween finds exactly the cross pairs with d ≤ rmax", () => {
    fc.assert(
      fc.property(pattern, pattern, fc.double({ min: 0.05, max: 8, noNaN: true }), (a, b, rmax) => {
        expect(list(pairsBetween(a, b, rmax))).toEqual(brute(a, b, rmax));
      }),
      { numRuns: 100 },
    );
  });

  it("counts a pair at exactly rmax and duplicates at distance 0", () => {
    const p = { x: Float64Array.from([0, 3, 3]), y: Float64Array.from([0, 4, 4]) };
    expect(list(pairsWithin(p, 5))).toEqual(["0,1,5.000000000", "0,2,5.000000000", "1,2,0.000000000"]);
  });

  it("nearestNeighbourDistances agrees with the all-pairs minimum", () => {
    fc.assert(
      fc.property(pattern, (p) => {
        const nn = nearestNeighbourDistances(p);
        for (let i = 0; i < p.x.length; i++) {
          let best = Infinity;
          for (let j = 0; j < p.x.length; j++)
            if (j !== i) best = Math.min(best, Math.hypot(p.x[j] - p.x[i], p.y[j] - p.y[i]));
          expect(nn[i]).toBeCloseTo(best, 12);
        }
      }),
      { numRuns: 100 },
    );
  });

  it("refuses a non-positive search radius", () => {
    const p = { x: Float64Array.from([0, 1]), y: Float64Array.from([0, 1]) };
    expect(() => pairsWithin(p, 0)).toThrow(/positive distance/);
  });
});
