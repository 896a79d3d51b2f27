import { describe, expect, it } from "vitest";
import { runSquareTest, runSquareTestAsync } from "./run-square-test";
import { PROGRESS_STEPS } from "./steps";
import { LATTICE_CAUTIONS } from "./square-verdict";
import type { LatticeSquare } from "./types";

/** A 12 × 10 grid of 1 m squares: low counts (1–3, varying), and a 3 × 3 block of 40s around E9 N7. */
function hotCorner(): LatticeSquare[] {
  const out: LatticeSquare[] = [];
  for (let r = 0; r < 10; r++) {
    for (let c = 0; c < 12; c++) {
      const hot = c >= 8 && c <= 10 && r >= 6 && r <= 8;
      out.push({
        id: `E${c} N${r}`,
        col: c,
        row: r,
        centre: [c + 0.5, r + 0.5],
        area: 1,
        value: hot ? 40 : 1 + ((c * 7 + r * 3) % 3),
      });
    }
  }
  return out;
}

describe("runSquareTest", () => {
  it("finds the planted block as clustered, with the cautions every square-count result carries", () => {
    const res = runSquareTest({ squares: hotCorner() }, { type: "moran", seed: 4 });
    expect(res.verdict).toBe("clustered");
    expect(res.pFrom).toBe("permutation");
    // two-sided: twice (1 + 0) / (999 + 1), no permutation reaching the observed I
    expect(res.p).toBeCloseTo(2 / 1000, 12);
    expect(res.summary).toMatch(/^Squares with similar values lie together .* at the 5 % level \(p = 0\.00200\)/);
    expect(res.cautions).toEqual(expect.arrayContaining(LATTICE_CAUTIONS));
    expect(res.cautions.join(" ")).toMatch(/modifiable areal unit problem/);
    expect(res.neighbours).toBe("queen contiguity (a shared edge or corner), on the grid");
  });

  it("marks the block's squares as hot spots after the adjustment, and nothing far from it", () => {
    const res = runSquareTest({ squares: hotCorner() }, { type: "getis-ord", seed: 4 });
    expect(res.verdict).toBe("hot or cold spots");
    const hot = res.squares!.filter((s) => s.class === "hot spot").map((s) => s.id);
    expect(hot).toContain("E9 N7"); // the centre of the block: Gi* sums nine 40s
    expect(
      hot.every((id) => {
        const [c, r] = id.slice(1).split(" N").map(Number);
        return c >= 7 && r >= 5;
      }),
    ).toBe(true);
    expect(res.squares!.every((s) => s.pAdjusted >= s.p)).toBe(true);
    expect(res.summary).toMatch(/after the false-discovery-rate adjustment at the 5 % level \(\d+ before it\)/);
    expect(res.cautions.join(" ")).toMatch(/Benjamini–Hochberg/);
  });

  it("labels local Moran quadrants: the block's centre high among high", () => {
    const res = runSquareTest({ squares: hotCorner() }, { type: "local-moran", seed: 4 });
    const centre = res.squares!.find((s) => s.id === "E9 N7")!;
    expect(centre.class).toBe("hot spot");
    expect(centre.statistic).toBeGreaterThan(0);
  });

  it("finds no evidence when the same counts are spread evenly in alternation", () => {
    const squares = hotCorner().map((s, k) => ({ ...s, value: (k * 37) % 11 }));
    const res = runSquareTest({ squares }, { type: "geary", seed: 2 });
    expect(["no evidence against the null", "dispersed"]).toContain(res.verdict);
  });

  it("warns when the permutations are too few for the adjustment to find anything", () => {
    const few = runSquareTest({ squares: hotCorner() }, { type: "getis-ord", permutations: 199 });
    // 120 squares, two-sided: the smallest p is 2/200 = 0.01, and a lone spot needs p ≤ 0.05/120.
    expect(few.cautions.join(" ")).toContain(
      "With 199 permutations the smallest p-value a square can reach is 0.010, too coarse for the adjustment across 120 squares to leave a lone hot or cold spot (it needs p ≤ 0.00042): use at least 4799 permutations.",
    );
    const enough = runSquareTest({ squares: hotCorner() }, { type: "getis-ord", permutations: 4799 });
    expect(enough.cautions.join(" ")).not.toMatch(/too coarse/);
  });

  it("says which squares were left out and why", () => {
    const squares = hotCorner();
    squares[0] = { ...squares[0], area: 0, value: 0 };
    squares[1] = { ...squares[1], area: 0.02 };
    const res = runSquareTest({ squares }, { type: "moran", minArea: 0.05, permutations: 0 });
    expect(res.leftOut).toEqual([
      { id: "E0 N0", reason: "not excavated" },
      { id: "E1 N0", reason: "below the minimum area" },
    ]);
    expect(res.cautions).toContain("2 squares were left out (not excavated, below the minimum area).");
    expect(res.pFrom).toBe("randomisation");
  });

  it("refuses a bad description or bad counts with a message naming the field", () => {
    expect(() => runSquareTest({ squares: hotCorner() }, { type: "moran", permutatons: 99 })).toThrow(
      /Unrecognized key.*permutatons/,
    );
    expect(() => runSquareTest({ squares: hotCorner() }, { type: "moran", permutations: -1 })).toThrow(/permutations/);
    expect(() => runSquareTest({ squares: hotCorner() }, { type: "kriging" })).toThrow(/type/);
    expect(() =>
      runSquareTest({ squares: hotCorner() }, { type: "moran", neighbours: { type: "distance", upper: 1, lower: 2 } }),
    ).toThrow(/lower limit/);
    const flat = hotCorner().map((s) => ({ ...s, value: 5 }));
    expect(() => runSquareTest({ squares: flat }, { type: "moran" })).toThrow(/Every square has the same value/);
  });

  describe("progress", () => {
    for (const type of ["moran", "geary", "local-moran", "getis-ord"] as const) {
      it(`${type}: reports its progress rising, a bounded number of times, and the same result as without`, () => {
        const seen: number[] = [];
        const spec = { type, permutations: 1999, seed: 8 };
        const res = runSquareTest({ squares: hotCorner() }, spec, { onProgress: (f) => seen.push(f) });
        expect(seen.length).toBeGreaterThan(10);
        expect(seen.length).toBeLessThanOrEqual(PROGRESS_STEPS);
        expect(seen).toEqual([...seen].sort((a, b) => a - b));
        expect(seen[0]).toBeGreaterThan(0);
        expect(seen.at(-1)).toBeLessThan(1);
        expect(seen.at(-1)).toBeGreaterThan(0.9);
        expect(res).toEqual(runSquareTest({ squares: hotCorner() }, spec));
      });
    }

    it("run asynchronously: gives the same result, lets timers run between steps, and stops when aborted", async () => {
      const spec = { type: "getis-ord", permutations: 4999, seed: 8 };
      let ticks = 0;
      const timer = setInterval(() => ticks++, 1);
      const res = await runSquareTestAsync({ squares: hotCorner() }, spec);
      clearInterval(timer);
      expect(res).toEqual(runSquareTest({ squares: hotCorner() }, spec));
      expect(ticks).toBeGreaterThan(0);
      const stop = new AbortController();
      let last = 0;
      const run = runSquareTestAsync({ squares: hotCorner() }, spec, {
        signal: stop.signal,
        onProgress: (f) => {
          last = f;
          if (f > 0.3) stop.abort();
        },
      });
      await expect(run).rejects.toMatchObject({ name: "AbortError" });
      expect(last).toBeGreaterThan(0.3);
      expect(last).toBeLessThan(0.5);
    });
  });
});
