import { describe, expect, test } from "vitest";
import { invert3, leastSquares, solveSquare, symmetricEigen } from "./small-linalg";

describe("the photo fit's linear algebra", () => {
  test("solves a square system and refuses a singular one", () => {
    expect(
      solveSquare(
        [
          [2, 1],
          [1, 3],
        ],
        [3, 5],
      ),
    ).toEqual([expect.closeTo(0.8, 12), expect.closeTo(1.4, 12)]);
    expect(
      solveSquare(
        [
          [1, 2],
          [2, 4],
        ],
        [1, 2],
      ),
    ).toBeNull();
    expect(
      solveSquare(
        [
          [1, 2],
          [2, 4 + 1e-15],
        ],
        [1, 2],
      ),
    ).toBeNull();
  });

  test("least squares recovers a line through noisy-free points", () => {
    const rows = [0, 1, 2, 3].map((x) => [x, 1]);
    const s = leastSquares(rows, [1, 3, 5, 7]);
    expect(s?.[0]).toBeCloseTo(2, 12);
    expect(s?.[1]).toBeCloseTo(1, 12);
  });

  test("symmetric eigenvalues come ascending with unit eigenvectors", () => {
    const { values, vectors } = symmetricEigen([
      [2, 1],
      [1, 2],
    ]);
    expect(values[0]).toBeCloseTo(1, 12);
    expect(values[1]).toBeCloseTo(3, 12);
    for (const v of vectors) expect(Math.hypot(...v)).toBeCloseTo(1, 12);
    expect(Math.abs(vectors[1]?.[0] ?? 0)).toBeCloseTo(Math.SQRT1_2, 12);
  });

  test("inverts a 3×3 matrix, and not a singular one", () => {
    const m = [2, 0, 0, 0, 4, 0, 1, 0, 1];
    const inv = invert3(m);
    expect(inv).not.toBeNull();
    // m · inv = I
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        let s = 0;
        for (let k = 0; k < 3; k++) s += (m[i * 3 + k] ?? NaN) * (inv?.[k * 3 + j] ?? NaN);
        expect(s).toBeCloseTo(i === j ? 1 : 0, 12);
      }
    expect(invert3([1, 2, 3, 2, 4, 6, 0, 0, 1])).toBeNull();
  });
});
