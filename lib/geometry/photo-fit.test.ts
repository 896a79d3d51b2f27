import { describe, expect, it } from "vitest";
import { applyFit, fitPhoto, invertFit, PhotoFitError, type ControlPoint } from "./photo-fit";

/** Control points made by pushing photo pixels through a known matrix. */
function through(matrix: number[], pixels: [number, number][]): ControlPoint[] {
  return pixels.map(([px, py]) => {
    const [x, y] = applyFit(matrix, px, py);
    return { px, py, x, y };
  });
}

function expectMatrix(got: number[], want: number[], tol = 1e-9) {
  expect(got).toHaveLength(9);
  expect(want).toHaveLength(9);
  const scale = want[8] ?? NaN;
  want.forEach((m, i) => {
    const w = m / scale;
    const g = got[i] ?? NaN;
    expect(Math.abs(g - w), `matrix[${i}] ${g} vs ${w}`).toBeLessThan(tol * Math.max(1, Math.abs(w)));
  });
}

// A camera 5 mm per pixel, turned 30°, photo y down → grid y up, shifted to a real-world-sized grid origin.
const k = 0.005;
const c = Math.cos(Math.PI / 6);
const s = Math.sin(Math.PI / 6);
const similarity = [k * c, k * s, 412_300.25, k * s, -k * c, 5_310_020.5, 0, 0, 1];
const affine = [0.004, 0.0007, 100, -0.0003, -0.0052, 250, 0, 0, 1];
// A slightly tilted camera: a genuine homography (bottom row not 0 0 1).
const projective = [0.0041, 0.0009, 12.5, -0.0004, -0.0049, 30.25, 2e-6, -3e-6, 1];

describe("fitPhoto recovers known transforms from synthetic control points", () => {
  it("similarity from two points, including the photo's y mirror", () => {
    const pts = through(similarity, [
      [120, 80],
      [3900, 2700],
    ]);
    const fit = fitPhoto(pts);
    expect(fit.model).toBe("similarity");
    expectMatrix(fit.matrix, similarity);
    // A pixel that was not a control point lands where the known transform puts it.
    const [x, y] = applyFit(fit.matrix, 2000, 1500);
    const [wx, wy] = applyFit(similarity, 2000, 1500);
    expect(Math.hypot(x - wx, y - wy)).toBeLessThan(1e-6);
    expect(fit.residuals.every((r) => r < 1e-6)).toBe(true);
    expect(fit.redundancy).toBe(0);
  });

  it("affine from three points", () => {
    const fit = fitPhoto(
      through(affine, [
        [0, 0],
        [4000, 300],
        [900, 3000],
      ]),
    );
    expect(fit.model).toBe("affine");
    expectMatrix(fit.matrix, affine);
  });

  it("projective from four points and from seven (over-determined, noise-free)", () => {
    const four = fitPhoto(
      through(projective, [
        [0, 0],
        [4000, 0],
        [4000, 3000],
        [0, 3000],
      ]),
    );
    expect(four.model).toBe("projective");
    expectMatrix(four.matrix, projective, 1e-7);
    const seven = fitPhoto(
      through(projective, [
        [10, 20],
        [3900, 40],
        [3950, 2950],
        [30, 2980],
        [2000, 1500],
        [1000, 2500],
        [3000, 700],
      ]),
    );
    expectMatrix(seven.matrix, projective, 1e-7);
    expect(seven.rms).toBeLessThan(1e-6);
    expect(seven.redundancy).toBe(3);
  });

  it("invertFit takes grid back to the photo", () => {
    const inv = invertFit(projective);
    const [x, y] = applyFit(projective, 1234, 987);
    const [px, py] = applyFit(inv, x, y);
    expect(px).toBeCloseTo(1234, 6);
    expect(py).toBeCloseTo(987, 6);
  });

  it("a lower model may be chosen when more points are given", () => {
    const fit = fitPhoto(
      through(similarity, [
        [0, 0],
        [4000, 0],
        [0, 3000],
        [4000, 3000],
      ]),
      { model: "similarity" },
    );
    expect(fit.model).toBe("similarity");
    expect(fit.redundancy).toBe(2);
    expectMatrix(fit.matrix, similarity);
  });
});

describe("projective fits are refined in metres after the DLT", () => {
  /** Seeded normal deviates: Park–Miller minimal standard generator and the Box–Muller transform. */
  function normals(seed: number) {
    let s = seed;
    const uniform = () => (s = (s * 48271) % 2147483647) / 2147483647;
    return () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
  }
  // Twelve pegs across a 4000 × 3000 photo, their surveyed positions off by about 2 cm (σ per axis).
  const pixels: [number, number][] = [
    [60, 40],
    [1400, 90],
    [2700, 30],
    [3950, 70],
    [3900, 1500],
    [3960, 2960],
    [2600, 2900],
    [1300, 2950],
    [40, 2980],
    [80, 1400],
    [1500, 1200],
    [2800, 1900],
  ];
  const rmsOf = (m: number[], pts: ControlPoint[]) =>
    Math.sqrt(
      pts.reduce((a, p) => {
        const [x, y] = applyFit(m, p.px, p.py);
        return a + (x - p.x) ** 2 + (y - p.y) ** 2;
      }, 0) / pts.length,
    );

  // An oblique photo (w from 0.7 to 1.6 over the frame): the DLT's algebraic error weights each peg by
  // its w, so its answer is visibly off the least-squares answer in metres.
  const oblique = [0.0041, 0.0009, 12.5, -0.0004, -0.0049, 30.25, 1.5e-4, -1e-4, 1];

  it("noisy pegs: a smaller RMS in metres than the DLT alone, and a minimum of that RMS", () => {
    for (const [truth, seed] of [
      [projective, 7],
      [oblique, 7],
      [oblique, 1234],
      [oblique, 99991],
    ] as const) {
      const noise = normals(seed);
      const pts = through(truth, pixels).map((p) => ({ ...p, x: p.x + 0.02 * noise(), y: p.y + 0.02 * noise() }));
      const dlt = fitPhoto(pts, { refine: false });
      const fit = fitPhoto(pts);
      expect(fit.model).toBe("projective");
      expect(fit.rms).toBeLessThan(dlt.rms * (truth === oblique ? 0.999 : 1));
      expect(fit.rms).toBeCloseTo(rmsOf(fit.matrix, pts), 12);
      // A minimum: nudging any of the eight free entries either way (by 1e-5 of its size) does not lower the RMS.
      for (let k = 0; k < 8; k++) {
        for (const sign of [1, -1]) {
          const nudged = fit.matrix.map((m, i) => (i === k ? m + sign * 1e-5 * (Math.abs(m) || 1e-9) : m));
          expect(rmsOf(nudged, pts)).toBeGreaterThanOrEqual(fit.rms * (1 - 1e-12));
        }
      }
      // With 2 cm of noise on twelve pegs the fit still puts the photo's centre within 2 cm of the truth.
      const [x, y] = applyFit(fit.matrix, 2000, 1500);
      const [tx, ty] = applyFit(truth, 2000, 1500);
      expect(Math.hypot(x - tx, y - ty)).toBeLessThan(0.02);
    }
  });

  it("exact pegs are still recovered exactly, by the DLT and after refinement", () => {
    for (const truth of [projective, oblique]) {
      const pts = through(truth, pixels);
      expectMatrix(fitPhoto(pts, { refine: false }).matrix, truth, 1e-7);
      const fit = fitPhoto(pts);
      expectMatrix(fit.matrix, truth, 1e-7);
      expect(fit.rms).toBeLessThan(1e-9);
    }
  });

  it("a genuinely perspective photo of a real-sized grid: the refinement does not wander off", () => {
    // Grid origin far from zero, as on a national grid: normalisation keeps the refinement well conditioned.
    const far = [0.0041, 0.0009, 412_300.25, -0.0004, -0.0049, 5_310_020.5, 2e-6, -3e-6, 1];
    const noise = normals(42);
    const pts = through(far, pixels).map((p) => ({ ...p, x: p.x + 0.01 * noise(), y: p.y + 0.01 * noise() }));
    const dlt = fitPhoto(pts, { refine: false });
    const fit = fitPhoto(pts);
    expect(fit.rms).toBeLessThanOrEqual(dlt.rms);
    // Expected RMS residual: σ = 0.01 m per coordinate on N = 12 pegs, p = 8 free parameters. The 2N squared
    // coordinate errors sum to 2Nσ² before the fit; a least-squares fit absorbs about p of those degrees of
    // freedom, leaving (2N − p)σ². fit.rms is per peg (both axes), so rms² ≈ (2N − p)σ²/N, i.e.
    // rms ≈ σ·√2·√((2N − p)/(2N)) = 0.01·√(4/3) ≈ 0.0115 m. Its spread (χ² on 16 degrees of freedom) is about
    // 18 % of that, so the common ±50 % tolerance is near three spreads either way: far from fitting the noise
    // away, and far from a fit that wandered off.
    const sigma = 0.01,
      n = pixels.length,
      params = 8;
    const expectedRms = sigma * Math.SQRT2 * Math.sqrt((2 * n - params) / (2 * n));
    expect(fit.rms).toBeGreaterThan(0.5 * expectedRms);
    expect(fit.rms).toBeLessThan(1.5 * expectedRms);
    // The fit tracks the true transform, not just the noisy pegs: at the pegs its gap to the truth has an
    // expected RMS of σ·√(p/N) (the p absorbed degrees of freedom spread over N pegs), ±50 %; the photo's
    // centre, surrounded by pegs, lands within σ of where the true transform puts it.
    const truePts = through(far, pixels);
    expect(rmsOf(fit.matrix, truePts)).toBeLessThan(1.5 * sigma * Math.sqrt(params / n));
    const [x, y] = applyFit(fit.matrix, 2000, 1500);
    const [tx, ty] = applyFit(far, 2000, 1500);
    expect(Math.hypot(x - tx, y - ty)).toBeLessThan(sigma);
  });
});

describe("residuals", () => {
  it("match the hand-computed plane fit of four square corners with one corner displaced", () => {
    // Hand computation: a least-squares plane through the 2×2 design (0,0),(1,0),(0,1),(1,1) with values
    // 0,1,0,1+d leaves a residual of d/4 at every corner (the design is orthogonal; the misfit is the
    // interaction term d/4·(±1)). Here the photo unit is 100 px, so x = px/100 with d = 0.08 m.
    const d = 0.08;
    const pts: ControlPoint[] = [
      { px: 0, py: 0, x: 0, y: 0 },
      { px: 100, py: 0, x: 1, y: 0 },
      { px: 0, py: 100, x: 0, y: 1 },
      { px: 100, py: 100, x: 1 + d, y: 1 },
    ];
    const fit = fitPhoto(pts, { model: "affine" });
    fit.residuals.forEach((r) => expect(r).toBeCloseTo(d / 4, 12));
    expect(fit.rms).toBeCloseTo(d / 4, 12);
    expect(fit.redundancy).toBe(1);
  });

  it("a two-point similarity is exact: both residuals are zero whatever the points", () => {
    const fit = fitPhoto([
      { px: 10, py: 10, x: 3, y: 4 },
      { px: 510, py: 10, x: 5.5, y: 4 },
    ]);
    expect(Math.max(...fit.residuals)).toBeLessThan(1e-9);
    // 500 px over 2.5 m: 5 mm a pixel; pixel (10, 210) is 1 m south of the first peg (photo y runs down).
    const [x, y] = applyFit(fit.matrix, 10, 210);
    expect(x).toBeCloseTo(3, 9);
    expect(y).toBeCloseTo(3, 9);
  });
});

describe("degenerate control points are refused with the reason", () => {
  const refuse = (pts: ControlPoint[], pattern: RegExp, model?: "similarity" | "affine" | "projective") => {
    let caught: unknown;
    try {
      fitPhoto(pts, { model });
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(PhotoFitError);
    expect((caught as Error).message).toMatch(pattern);
  };

  it("too few points", () => refuse([{ px: 0, py: 0, x: 0, y: 0 }], /at least 2/));
  it("duplicate photo points", () =>
    refuse(
      [
        { px: 5, py: 5, x: 0, y: 0 },
        { px: 5.2, py: 5, x: 1, y: 1 },
      ],
      /Points 1 and 2 .*same spot.*duplicate/,
    ));
  it("duplicate grid points", () =>
    refuse(
      [
        { px: 5, py: 5, x: 1, y: 1 },
        { px: 50, py: 5, x: 1, y: 1 },
      ],
      /same grid position/,
    ));
  it("three collinear points for an affine fit", () =>
    refuse(
      [
        { px: 0, py: 0, x: 0, y: 0 },
        { px: 100, py: 100, x: 1, y: 0 },
        { px: 200, py: 200, x: 0, y: 1 },
      ],
      /one line on the photo \(collinear\)/,
    ));
  it("collinear grid positions", () =>
    refuse(
      [
        { px: 0, py: 0, x: 0, y: 0 },
        { px: 100, py: 0, x: 1, y: 1 },
        { px: 0, py: 100, x: 2, y: 2 },
      ],
      /one line on the grid/,
    ));
  it("four points with three in line for a projective fit", () =>
    refuse(
      [
        { px: 0, py: 0, x: 0, y: 0 },
        { px: 100, py: 0, x: 1, y: 0 },
        { px: 200, py: 0, x: 2, y: 0.001 },
        { px: 0, py: 100, x: 0, y: -1 },
      ],
      /Points 1, 2, 3 lie on one line/,
    ));
  it("non-finite grid coordinates", () =>
    refuse(
      [
        { px: 0, py: 0, x: NaN, y: 0 },
        { px: 1, py: 1, x: 1, y: 1 },
      ],
      /finite/,
    ));
});
