/**
 * Every estimator is invariant to translating the window and its points together, and to turning them by
 * 90°. Points sit on a 0.02 m lattice and the r grid on 0.01 m steps, so many pair distances (0.04, 0.05,
 * 0.1, …) and boundary distances are exactly grid values: in exact arithmetic the answer is the same in
 * every frame, and in floating point the shifted coordinates (0.1 and 1000.37 are not exact in binary) put
 * those distances a rounding error above or below the grid value. Values are compared to 1e-6 relative: a
 * pair binned differently changes K by at least 1/(pairs) ≈ 1e-3, while the isotropic weight's square-root
 * cusp where the circle touches the edge (d = b exactly, common on a lattice) turns a 1e-13 rounding into
 * about 1e-7. Fixed seed, bounded runs.
 */
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { createWindow } from "../geometry/window";
import type { WindowInput } from "../types";
import { clarkEvans } from "./clark-evans";
import { crossK } from "./cross-k";
import { intensityAtPoints } from "./intensity";
import { kFunction } from "./k-function";
import { kInhom } from "./k-inhom";
import { pairCorrelation } from "./pair-correlation";
import { quadratTest } from "./quadrat";

type Pt = [number, number];
const RECT: Pt[] = [
  [0, 0],
  [1, 0],
  [1, 0.8],
  [0, 0.8],
];
const ELL: Pt[] = [
  [0, 0],
  [1, 0],
  [1, 0.4],
  [0.5, 0.4],
  [0.5, 0.8],
  [0, 0.8],
];
const HOLE: Pt[] = [
  [0.6, 0.1],
  [0.8, 0.1],
  [0.8, 0.2],
  [0.6, 0.2],
];
const WINDOWS: { name: string; input: WindowInput }[] = [
  { name: "rectangle", input: { outer: RECT } },
  { name: "L-shaped trench", input: { outer: ELL } },
  { name: "rectangle with a baulk", input: { outer: RECT, holes: [HOLE] } },
];
const R = Array.from({ length: 26 }, (_, k) => k / 100);

/** Turn by q·90° about the origin, then shift: exact for the turn, rounding for the shift. */
const move =
  (q: number, dx: number, dy: number) =>
  ([x, y]: Pt): Pt => {
    let [u, v] = [x, y];
    for (let i = 0; i < q; i++) [u, v] = [-v, u];
    return [u + dx, v + dy];
  };

function estimates(input: WindowInput, pts: Pt[]) {
  const W = createWindow(input);
  const x = pts.map((p) => p[0]),
    y = pts.map((p) => p[1]);
  const half = Math.floor(pts.length / 2);
  const A = { x: x.slice(0, half), y: y.slice(0, half) },
    B = { x: x.slice(half), y: y.slice(half) };
  const K = kFunction(W, { x, y }, { r: R, correction: ["isotropic", "translation", "border"] }).K;
  const cross = crossK(W, A, B, { r: R, correction: ["isotropic", "translation", "border"] }).K;
  const ce = clarkEvans(W, { x, y });
  // 3 × 3 quadrats: the grid is the same after a turn, and no lattice point lies on a cell line, where a
  // turn would move it to the other cell (R's cut puts a find on a line in the cell below or to the left)
  const nx = 3,
    ny = 3;
  return {
    Kiso: K.isotropic!,
    Ktrans: K.translation!,
    Kborder: K.border!,
    crossIso: cross.isotropic!,
    crossTrans: cross.translation!,
    crossBorder: cross.border!,
    g: pairCorrelation(W, { x, y }, { r: R.slice(1), halfWidth: 0.05 }).g.isotropic!,
    kInhom: kInhom(W, { x, y }, { r: R, intensity: { sigma: 0.2 } }).K.isotropic!,
    intensity: intensityAtPoints(W, { x, y }, { sigma: 0.2 }).values,
    clarkEvans: Float64Array.of(ce.R, ce.z),
    quadratX2: Float64Array.of(quadratTest(W, { x, y }, { nx, ny }).X2),
  };
}

function expectSame(a: ReturnType<typeof estimates>, b: ReturnType<typeof estimates>, what: string) {
  for (const key of Object.keys(a) as (keyof typeof a)[]) {
    const u = a[key],
      v = b[key];
    for (let k = 0; k < u.length; k++) {
      const label = `${what}: ${key} at index ${k} (${u[k]} vs ${v[k]})`;
      if (Number.isNaN(u[k]) || Number.isNaN(v[k])) expect(Number.isNaN(u[k]) && Number.isNaN(v[k]), label).toBe(true);
      else expect(Math.abs(u[k] - v[k]) <= 1e-6 * Math.abs(u[k]) + 1e-9, label).toBe(true);
    }
  }
}

/** Distinct lattice points strictly inside the window (none on an edge). */
const lattice = (input: WindowInput) =>
  fc
    .uniqueArray(fc.tuple(fc.integer({ min: 1, max: 49 }), fc.integer({ min: 1, max: 39 })), {
      minLength: 8,
      maxLength: 24,
      selector: (p) => `${p[0]},${p[1]}`,
    })
    .map((cells) => cells.map(([i, j]): Pt => [i * 0.02, j * 0.02]))
    .filter((pts) => {
      const W = createWindow(input);
      return pts.filter((p) => W.contains(p[0], p[1]) && W.boundaryDistance(p[0], p[1]) > 1e-12).length === pts.length;
    });

const shift = fc.oneof(fc.constantFrom(0.1, 1000.37, -0.3, 7.77), fc.double({ min: -1000, max: 1000, noNaN: true }));

describe("estimators do not depend on where the trench lies on the site grid", () => {
  for (const { name, input } of WINDOWS) {
    test(`${name}: translating and turning by 90° window and points together changes nothing`, () => {
      fc.assert(
        fc.property(lattice(input), fc.integer({ min: 0, max: 3 }), shift, shift, (pts, q, dx, dy) => {
          const f = move(q, dx, dy);
          const moved: WindowInput = { outer: input.outer.map(f), holes: input.holes?.map((h) => h.map(f)) };
          expectSame(estimates(input, pts), estimates(moved, pts.map(f)), `turned ${90 * q}°, shifted (${dx}, ${dy})`);
        }),
        { seed: 20261203, numRuns: 40 },
      );
    });
  }

  test("the three-point pattern of the report: K(0.04) is 1/3 in [0,1]×[−1,0] and in the shifted copy", () => {
    // exact arithmetic: one pair at distance 0.04, both points more than 0.04 from the edge (weights 1), and
    // in a rectangle on an even grid a pair counts at r when d ≤ r (spatstat's Krect rule):
    // K(0.04) = |W| / (n(n−1)) · 2 = 1/3
    const pts: Pt[] = [
      [0.5, -0.5],
      [0.5, -0.46],
      [0.9, -0.9],
    ];
    const r = Array.from({ length: 26 }, (_, k) => k / 100);
    for (const dy of [0, 1, 0.1, 1000.37]) {
      const W = createWindow({
        outer: [
          [0, -1 + dy],
          [1, -1 + dy],
          [1, dy],
          [0, dy],
        ],
      });
      const K = kFunction(
        W,
        { x: pts.map((p) => p[0]), y: pts.map((p) => p[1] + dy) },
        { r, correction: ["isotropic", "translation"] },
      ).K;
      expect(K.isotropic![4], `shifted by ${dy}`).toBeCloseTo(1 / 3, 12);
      expect(K.isotropic![3], `shifted by ${dy}`).toBe(0);
    }
  });
});
