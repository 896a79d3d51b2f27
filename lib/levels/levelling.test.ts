import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { LevelBookError, reduceLevelRun, type LevelBookRow } from "./levelling";
import { workedBook } from "./worked-example";

/** The worked example (worked-example.ts: its readings, and every RL worked by hand). */
const book = workedBook;

describe("reduceLevelRun", () => {
  it("reduces the worked example as booked by hand", () => {
    const run = reduceLevelRun({ startLevel: 50, rows: book, closingLevel: 48.13, tolerance: 0.01 });
    expect(run.rows.map((r) => r.level)).toEqual([50, 49.655, 49.385, 48.91, 48.89, 48.135]);
    expect(run.rows.map((r) => r.heightOfInstrument)).toEqual([51.525, 51.525, 51.525, 49.895, 49.895, 49.895]);
    expect(run.sumBacksights).toBe(2.51);
    expect(run.sumForesights).toBe(4.375);
    expect(run.rise).toBe(-1.865);
    expect(run.misclosure).toBe(0.005);
    expect(run.withinTolerance).toBe(true);
  });

  it("flags a run that closes outside the director's tolerance", () => {
    const run = reduceLevelRun({ startLevel: 50, rows: book, closingLevel: 48.13, tolerance: 0.003 });
    expect(run.withinTolerance).toBe(false);
    expect(run.misclosure).toBe(0.005);
  });

  it("leaves the closure unknown on a run that does not close on a benchmark", () => {
    const run = reduceLevelRun({ startLevel: 50, rows: book, tolerance: 0.003 });
    expect(run.misclosure).toBeNull();
    expect(run.withinTolerance).toBeNull();
  });

  it("refuses books that cannot be reduced, naming the line", () => {
    const cases: [LevelBookRow[], RegExp][] = [
      [
        [
          { station: "BM A", foresight: 1 },
          { station: "x", foresight: 1 },
        ],
        /first line is the backsight/,
      ],
      [[{ station: "BM A", backsight: 1 }, { station: "x" }], /Line 2 \(x\) has no reading/],
      [
        [
          { station: "BM A", backsight: 1 },
          { station: "x", intermediate: 1, foresight: 1 },
        ],
        /Line 2 .*stands alone/,
      ],
      [
        [
          { station: "BM A", backsight: 1 },
          { station: "x", backsight: 1 },
        ],
        /Line 2 .*change point first/,
      ],
      [
        [
          { station: "BM A", backsight: 1 },
          { station: "CP", foresight: 1, backsight: 1 },
        ],
        /last line \(CP\) ends on a backsight/,
      ],
      [
        [
          { station: "BM A", backsight: 1 },
          { station: "x", foresight: -0.2 },
        ],
        /Line 2: the foresight must be a staff reading/,
      ],
      [
        [
          { station: "BM A", backsight: Number.NaN },
          { station: "x", foresight: 1 },
        ],
        /Line 1: the backsight/,
      ],
    ];
    for (const [rows, message] of cases) {
      expect(() => reduceLevelRun({ startLevel: 10, rows, tolerance: 0.005 })).toThrow(message);
      expect(() => reduceLevelRun({ startLevel: 10, rows, tolerance: 0.005 })).toThrow(LevelBookError);
    }
  });

  /** Readings in whole millimetres, as a level book holds them. */
  const reading = fc.integer({ min: 0, max: 4500 }).map((mm) => mm / 1000);
  const setup = fc.record({ backsight: reading, sights: fc.array(reading, { maxLength: 4 }), foresight: reading });

  it("ΣBS − ΣFS = last RL − first RL, and agrees with the rise-and-fall method, on any run (seeded)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: -500_000, max: 500_000 }),
        fc.array(setup, { minLength: 1, maxLength: 6 }),
        (startMm, setups) => {
          const rows: LevelBookRow[] = [];
          setups.forEach((s, k) => {
            if (k === 0) rows.push({ station: "BM", backsight: s.backsight });
            else rows[rows.length - 1] = { ...rows[rows.length - 1]!, backsight: s.backsight };
            s.sights.forEach((is, j) => rows.push({ station: `s${k}.${j}`, intermediate: is }));
            rows.push({ station: `cp${k}`, foresight: s.foresight });
          });
          const start = startMm / 1000;
          const run = reduceLevelRun({ startLevel: start, rows, tolerance: 0.005 });
          const last = run.rows[run.rows.length - 1]!.level;
          expect(Math.abs(run.rise - (last - start))).toBeLessThan(1e-6);
          // Rise and fall: each reading after the previous one on the same set-up; a rise is previous − current.
          let level = start;
          let previous = rows[0]!.backsight!;
          rows.slice(1).forEach((row, i) => {
            const sight = row.foresight ?? row.intermediate!;
            level += previous - sight;
            expect(Math.abs(run.rows[i + 1]!.level - level)).toBeLessThan(1e-6);
            previous = row.backsight ?? sight;
          });
        },
      ),
      { seed: 20261203, numRuns: 300 },
    );
  });
});
