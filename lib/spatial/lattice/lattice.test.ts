import { describe, expect, it } from "vitest";
import { buildLattice } from "./lattice";
import { latticeWeights } from "./weights";
import { moranI } from "./moran";
import { gearyC } from "./geary";
import type { LatticeSquare } from "./types";

/** A full nx × ny grid of 1 m squares, value from f(col, row). */
function grid(nx: number, ny: number, f: (c: number, r: number) => number): LatticeSquare[] {
  const out: LatticeSquare[] = [];
  for (let r = 0; r < ny; r++) {
    for (let c = 0; c < nx; c++) {
      out.push({
        id: `E${c} N${r}`,
        col: c,
        row: r,
        centre: [c + 0.5, r + 0.5],
        area: 1,
        value: f(c, r),
        rings: [
          [
            [c, r],
            [c + 1, r],
            [c + 1, r + 1],
            [c, r + 1],
          ],
        ],
      });
    }
  }
  return out;
}

describe("square-count input", () => {
  it("leaves out squares with no excavated area and those below the minimum area", () => {
    const squares = grid(3, 3, (c, r) => c + r);
    squares[0].area = 0;
    squares[0].value = 0;
    squares[4].area = 0.05;
    const lat = buildLattice({ squares }, { minArea: 0.1, neighbours: { type: "rook" }, isolated: "drop" });
    expect(lat.leftOut).toEqual([
      { id: "E0 N0", reason: "not excavated" },
      { id: "E1 N1", reason: "below the minimum area" },
    ]);
    expect(lat.ids).toHaveLength(7);
  });

  it("tests density per excavated m² by default, and counts on request", () => {
    const squares = grid(2, 2, () => 4);
    squares[1].area = 0.5;
    expect(Array.from(buildLattice({ squares }).values)).toEqual([4, 8, 4, 4]);
    expect(Array.from(buildLattice({ squares }, { variable: "count" }).values)).toEqual([4, 4, 4, 4]);
  });

  it("refuses bad input with a message naming the square", () => {
    const squares = grid(2, 2, () => 1);
    expect(() => buildLattice({ squares: [] })).toThrow(/no squares with counts/);
    expect(() => buildLattice({ squares: squares.map((s, k) => (k === 2 ? { ...s, value: -3 } : s)) })).toThrow(
      "Square E0 N1: the count is negative (-3)",
    );
    expect(() => buildLattice({ squares: squares.map((s) => ({ ...s, area: 0, value: 0 })) })).toThrow(
      /leaves no square to test/,
    );
    expect(() => buildLattice({ squares: squares.map((s, k) => (k === 1 ? { ...s, id: "E0 N0" } : s)) })).toThrow(
      "Square E0 N0 appears twice.",
    );
    expect(() => buildLattice({ squares: squares.map((s, k) => (k === 1 ? { ...s, area: -1 } : s)) })).toThrow(
      /E1 N0: the excavated area/,
    );
    const apart = [squares[0], { ...squares[3] }];
    expect(() => buildLattice({ squares: apart }, { neighbours: { type: "rook" } })).toThrow(
      /Squares E0 N0, E1 N1 have no neighbours under rook contiguity/,
    );
  });
});

describe("global tests on hand-made grids", () => {
  it("gives Moran's I = −1 and Geary's C above 1 on a rook checkerboard (hand calculation)", () => {
    // Every rook neighbour differs: z_i z_j = −a² on every link, so I = (n/S0)(−a² S0)/(n a²) = −1.
    const lat = buildLattice(
      { squares: grid(4, 4, (c, r) => ((c + r) % 2 ? 10 : 2)) },
      { neighbours: { type: "rook" } },
    );
    const w = latticeWeights(lat.neighbours, "binary");
    const res = moranI(lat.values, w, { permutations: 99, seed: 3 });
    expect(res.I).toBeCloseTo(-1, 12);
    expect(res.expected).toBeCloseTo(-1 / 15, 15);
    // C = (n−1)/(2 S0) Σ w (x_i−x_j)² / Σz² = 15/(2·48) · 48·64 / (16·16) = 1.875
    expect(gearyC(lat.values, w, { permutations: 0 }).C).toBeCloseTo(1.875, 12);
    expect(res.p.permutation).toBeLessThan(0.05);
  });
});
