import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { projectSection, type SectionInput } from "./section";

const find = (n: number, x: number, y: number, level: number | null): SectionInput<number> => ({
  x,
  y,
  level,
  item: n,
});

describe("projectSection", () => {
  it("projects onto a line along the grid's x axis: distance = x − start, offset = y − line", () => {
    const s = projectSection({ start: [2, 5], end: [12, 5], halfWidth: 0.5 }, [
      find(1, 4, 5.2, 41.3),
      find(2, 3, 4.6, 41.1),
      find(3, 7, 5.6, 41.0), // 0.6 m off the line: outside a 0.5 m band
      find(4, 1.9, 5, 40.9), // before the start
      find(5, 12.1, 5, 40.9), // past the end
      find(6, 10, 5, null), // inside, no level
    ]);
    expect(s.length).toBe(10);
    expect(s.finds.map((f) => f.item)).toEqual([2, 1]);
    expect(s.finds[0]).toMatchObject({ along: 1, level: 41.1 });
    expect(s.finds[0]!.offset).toBeCloseTo(-0.4, 12);
    expect(s.finds[1]!.along).toBeCloseTo(2, 12);
    expect(s.finds[1]!.offset).toBeCloseTo(0.2, 12);
    expect(s.withoutLevel).toEqual([6]);
  });

  it("measures along a diagonal line by Pythagoras (3-4-5)", () => {
    const s = projectSection({ start: [0, 0], end: [6, 8], halfWidth: 1 }, [
      find(1, 3, 4, 10),
      find(2, 3 - 0.8, 4 + 0.6, 9),
    ]);
    expect(s.length).toBe(10);
    expect(s.finds[0]!.along).toBeCloseTo(5, 12);
    expect(s.finds[0]!.offset).toBeCloseTo(0, 12);
    // (−0.8, 0.6) is a unit step perpendicular to (0.6, 0.8), to the left of the line.
    expect(s.finds[1]!.along).toBeCloseTo(5, 12);
    expect(s.finds[1]!.offset).toBeCloseTo(1, 12);
  });

  it("refuses a line of no length or a band of no width", () => {
    expect(() => projectSection({ start: [1, 1], end: [1, 1], halfWidth: 1 }, [])).toThrow(/a millimetre long/);
    expect(() => projectSection({ start: [0, 0], end: [1, 1], halfWidth: 0 }, [])).toThrow(/wider than 0 m/);
  });

  it("recovers a point's place along and across the line, and mirrors it when the line is reversed (seeded)", () => {
    const coord = fc.double({ min: -50, max: 50, noNaN: true });
    const fraction = fc.double({ min: 0.01, max: 0.99, noNaN: true });
    const across = fc.double({ min: -100, max: 100, noNaN: true });
    fc.assert(
      fc.property(coord, coord, coord, coord, fraction, across, (x0, y0, x1, y1, t, o) => {
        const length = Math.hypot(x1 - x0, y1 - y0);
        fc.pre(length > 0.01);
        const [ux, uy] = [(x1 - x0) / length, (y1 - y0) / length];
        const pts = [find(1, x0 + t * length * ux - o * uy, y0 + t * length * uy + o * ux, 3)];
        const a = projectSection({ start: [x0, y0], end: [x1, y1], halfWidth: 200 }, pts);
        const b = projectSection({ start: [x1, y1], end: [x0, y0], halfWidth: 200 }, pts);
        expect(a.finds[0]!.along).toBeCloseTo(t * length, 9);
        expect(a.finds[0]!.offset).toBeCloseTo(o, 9);
        expect(a.finds[0]!.along + b.finds[0]!.along).toBeCloseTo(length, 9);
        expect(a.finds[0]!.offset + b.finds[0]!.offset).toBeCloseTo(0, 9);
      }),
      { seed: 1203, numRuns: 200 },
    );
  });
});
