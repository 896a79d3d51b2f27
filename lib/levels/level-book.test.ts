import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { readReading, reduceAsBooked } from "./level-book";
import { reduceLevelRun, type LevelBookRow } from "./levelling";
import { workedBook } from "./worked-example";

/** The worked example (worked-example.ts: readings made up, every RL worked by hand). */
const book = workedBook;

describe("reduceAsBooked", () => {
  it("reduces the worked example line by line, with the hand-worked levels and closure", () => {
    const run = reduceAsBooked(50, book, 48.13, 0.01);
    expect(run.lines.map((l) => l.level)).toEqual([50, 49.655, 49.385, 48.91, 48.89, 48.135]);
    expect(run.lines.map((l) => l.heightOfInstrument)).toEqual([51.525, 51.525, 51.525, 49.895, 49.895, 49.895]);
    expect(run.lines.every((l) => l.problem === null)).toBe(true);
    expect(run.misclosure).toBe(0.005);
    expect(run.withinTolerance).toBe(true);
    expect(run.unfinished).toBeNull();
    expect(reduceAsBooked(50, book, 48.13, 0.003).withinTolerance).toBe(false);
  });

  it("reduces a half-typed book as far as it goes and names what is missing", () => {
    const typing = [...book.slice(0, 3), { station: "CP1", foresight: 2.615, backsight: 0.985 }];
    const run = reduceAsBooked(50, typing, 48.13, 0.005);
    expect(run.lines.map((l) => l.level)).toEqual([50, 49.655, 49.385, 48.91]);
    expect(run.unfinished).toMatch(/ends on a backsight/);
    expect(run.misclosure).toBeNull();
    const blank = reduceAsBooked(50, [...book.slice(0, 2), { station: "find 19" }], null, 0.005);
    expect(blank.lines[2]).toEqual({
      heightOfInstrument: 51.525,
      level: null,
      problem: "Line 3 (find 19) has no reading.",
    });
    expect(blank.unfinished).toBe("1 line of the book cannot be reduced yet.");
    expect(reduceAsBooked(null, book, null, 0.005).unfinished).toMatch(/Choose the benchmark/);
  });

  it("after a line that cannot be read as a change point, later levels are unknown rather than wrong", () => {
    const rows = [book[0]!, { station: "CP1", intermediate: 1.2, backsight: 1.1 }, { station: "x", intermediate: 1 }];
    const run = reduceAsBooked(50, rows, null, 0.005);
    expect(run.lines[1]!.problem).toMatch(/Line 2 .*stands alone/);
    expect(run.lines[2]!.level).toBeNull();
  });

  const reading = fc.integer({ min: 0, max: 4500 }).map((mm) => mm / 1000);
  const setup = fc.record({ backsight: reading, sights: fc.array(reading, { maxLength: 3 }), foresight: reading });

  it("gives the server's reduction (reduceLevelRun) on every complete book (seeded)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 200_000 }),
        fc.array(setup, { minLength: 1, maxLength: 5 }),
        fc.integer({ min: -20, max: 20 }),
        (startMm, setups, offMm) => {
          const rows: LevelBookRow[] = [];
          setups.forEach((s, k) => {
            if (k === 0) rows.push({ station: "BM", backsight: s.backsight });
            else rows[rows.length - 1] = { ...rows[rows.length - 1]!, backsight: s.backsight };
            s.sights.forEach((is, j) => rows.push({ station: `s${k}.${j}`, intermediate: is }));
            rows.push({ station: `cp${k}`, foresight: s.foresight });
          });
          const start = startMm / 1000;
          const server = reduceLevelRun({
            startLevel: start,
            rows,
            tolerance: 0.005,
            closingLevel: start + offMm / 1000,
          });
          const live = reduceAsBooked(start, rows, start + offMm / 1000, 0.005);
          expect(live.unfinished).toBeNull();
          expect(live.lines.map((l) => l.level)).toEqual(server.rows.map((r) => r.level));
          expect(live.rise).toBe(server.rise);
          expect(live.misclosure).toBe(server.misclosure);
          expect(live.withinTolerance).toBe(server.withinTolerance);
        },
      ),
      { seed: 20261203, numRuns: 200 },
    );
  });
});

describe("readReading", () => {
  it("reads staff readings as typed, and says when one is not a number", () => {
    expect(readReading("")).toBeNull();
    expect(readReading(" 1.525 ")).toBe(1.525);
    expect(readReading("1,525")).toBe(1.525);
    expect(readReading("0.9")).toBe(0.9);
    expect(readReading("1.5.2")).toBe("bad");
    expect(readReading("-1")).toBe("bad");
    expect(readReading("abc")).toBe("bad");
    expect(readReading(".")).toBe("bad");
  });
});
