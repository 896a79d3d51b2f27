import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { createWindow } from "./window";
import { firstSelfContact, ringDiameter, segmentsTouch, type RingWork } from "./ring";
import { MAX_HOLES, MAX_RING_VERTICES } from "./limits";
import type { Ring } from "../types";

/** The plain nested loop over every pair of edges: the reference the indexed check must agree with. */
function bruteSelfContact(ring: Ring): [number, number] | null {
  const m = ring.length;
  for (let i = 0; i < m; i++) {
    for (let j = i + 1; j < m; j++) {
      const [a, b, c, d] = [ring[i], ring[(i + 1) % m], ring[j], ring[(j + 1) % m]];
      if (j === i + 1 || (i === 0 && j === m - 1)) {
        const [p, s, q] = j === i + 1 ? [a, b, d] : [b, a, c];
        const o = (s[0] - p[0]) * (q[1] - p[1]) - (s[1] - p[1]) * (q[0] - p[0]);
        const dot = (p[0] - s[0]) * (q[0] - s[0]) + (p[1] - s[1]) * (q[1] - s[1]);
        if (o === 0 && dot > 0) return [i, j];
        continue;
      }
      if (segmentsTouch(a, b, c, d)) return [i, j];
    }
  }
  return null;
}

/** A wavy closed outline of n vertices around (0, 0): simple, with every edge short. */
function wavy(n: number, cx = 0, cy = 0): Ring {
  return Array.from({ length: n }, (_, k) => {
    const t = (2 * Math.PI * k) / n;
    const r = 10 + 0.8 * Math.sin(9 * t);
    return [cx + r * Math.cos(t), cy + r * Math.sin(t)] as [number, number];
  });
}

/** A saw-tooth trench edge of n vertices: long thin teeth, the shape a careless trace gives. */
function sawTooth(n: number): Ring {
  const teeth = (n - 2) / 2;
  const ring: Ring = [];
  for (let k = 0; k < teeth; k++) ring.push([k, 0], [k + 0.5, 5]);
  ring.push([teeth, -3], [0, -3]);
  return ring;
}

describe("the ring checks stay near-linear", () => {
  it("a valid 2,000-vertex outline is checked with a few tests per edge, not all pairs", () => {
    for (const ring of [wavy(MAX_RING_VERTICES), sawTooth(MAX_RING_VERTICES)]) {
      expect(ring).toHaveLength(MAX_RING_VERTICES);
      const work: RingWork = { segmentTests: 0 };
      expect(firstSelfContact(ring, work)).toBeNull();
      // All pairs would be m(m − 1)/2 = 1,999,000 tests; the index leaves a handful per edge.
      expect(work.segmentTests).toBeGreaterThan(0);
      expect(work.segmentTests).toBeLessThanOrEqual(8 * ring.length);
    }
  });

  it("the whole window of a 2,000-vertex outline with 20 holes of 2,000 vertices is near-linear work", () => {
    const holes = Array.from({ length: MAX_HOLES }, (_, k) =>
      wavy(MAX_RING_VERTICES, 0, 0).map(
        ([x, y]) => [x / 60 + 40 * (k % 5), y / 60 + 40 * Math.floor(k / 5)] as [number, number],
      ),
    );
    const outer = wavy(MAX_RING_VERTICES).map(([x, y]) => [90 + 12 * x, 60 + 12 * y] as [number, number]);
    const work = { segmentTests: 0, distanceTests: 0 };
    const w = createWindow({ outer, holes }, work);
    expect(w.holes).toHaveLength(MAX_HOLES);
    const edges = outer.length + MAX_HOLES * MAX_RING_VERTICES;
    expect(work.segmentTests).toBeGreaterThan(0);
    expect(work.segmentTests).toBeLessThanOrEqual(8 * edges);
    expect(work.distanceTests).toBeLessThanOrEqual(4 * outer.length);
  });

  it("the diameter of a 2,000-vertex outline takes a few distances per hull vertex", () => {
    const work = { distanceTests: 0 };
    const ring = wavy(MAX_RING_VERTICES);
    ringDiameter(ring, work);
    expect(work.distanceTests).toBeGreaterThan(0);
    expect(work.distanceTests).toBeLessThanOrEqual(2 * ring.length);
  });
});

describe("the indexed checks give the nested loop's answers", () => {
  const coord = fc.integer({ min: 0, max: 6 });
  const ringArb = fc.array(fc.tuple(coord, coord), { minLength: 3, maxLength: 14 });

  it("the same first contact (or none) on small rings with many touching and collinear cases", () => {
    fc.assert(
      fc.property(ringArb, (pts) => {
        expect(firstSelfContact(pts as Ring)).toEqual(bruteSelfContact(pts as Ring));
      }),
      { numRuns: 3000 },
    );
  });

  it("the same diameter as the largest distance between any two vertices", () => {
    const mm = fc.integer({ min: -50_000, max: 50_000 }).map((v) => v / 1000);
    fc.assert(
      // Millimetre coordinates within ±50 m, as surveyed; many collinear and repeated points at this grain.
      fc.property(fc.array(fc.tuple(mm, mm), { minLength: 1, maxLength: 40 }), (pts) => {
        let brute = 0;
        for (const p of pts) for (const q of pts) brute = Math.max(brute, Math.hypot(p[0] - q[0], p[1] - q[1]));
        // Equal up to rounding: the hull's orientation tests may drop a vertex lying within rounding of a hull
        // edge, which moves the diameter by about the coordinates' size times the machine epsilon.
        const scale = Math.max(1, ...pts.flat().map(Math.abs));
        expect(Math.abs(ringDiameter(pts as Ring) - brute)).toBeLessThanOrEqual(1e-9 * scale);
      }),
      { numRuns: 5000 },
    );
  });

  it("still refuses a 2,000-vertex outline with one crossing, naming the edges the nested loop names", () => {
    const ring = wavy(MAX_RING_VERTICES);
    [ring[700], ring[701]] = [ring[701], ring[700]];
    const contact = firstSelfContact(ring);
    expect(contact).toEqual(bruteSelfContact(ring));
    expect(contact).not.toBeNull();
    expect(() => createWindow({ outer: ring })).toThrow(/crosses or touches itself \(edges 700 and 702\)/);
  });
});

describe("outline size limits", () => {
  it("refuses a ring of more than 2,000 vertices, stating the limit", () => {
    expect(() => createWindow({ outer: wavy(MAX_RING_VERTICES + 1) })).toThrow(
      /The outer ring has 2,001 vertices; at most 2,000 are allowed/,
    );
    expect(() =>
      createWindow({
        outer: [
          [-20, -20],
          [20, -20],
          [20, 20],
          [-20, 20],
        ],
        holes: [wavy(MAX_RING_VERTICES + 1).map(([x, y]) => [x / 2, y / 2] as [number, number])],
      }),
    ).toThrow(/hole 1 has 2,001 vertices; at most 2,000/);
    // A closing vertex repeating the first is not counted.
    const closed = wavy(MAX_RING_VERTICES);
    expect(createWindow({ outer: [...closed, closed[0]] }).outer).toHaveLength(MAX_RING_VERTICES);
  });

  it("refuses more than 20 holes, stating the limit", () => {
    const outer: Ring = [
      [0, 0],
      [100, 0],
      [100, 100],
      [0, 100],
    ];
    const hole = (k: number): Ring => [
      [1 + 4 * k, 1],
      [3 + 4 * k, 1],
      [3 + 4 * k, 3],
    ];
    expect(createWindow({ outer, holes: Array.from({ length: MAX_HOLES }, (_, k) => hole(k)) }).holes).toHaveLength(20);
    expect(() => createWindow({ outer, holes: Array.from({ length: MAX_HOLES + 1 }, (_, k) => hole(k)) })).toThrow(
      /21 holes; at most 20 are allowed/,
    );
  });
});
