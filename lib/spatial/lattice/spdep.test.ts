/**
 * Outside check: the square-count tests against R's spdep on the fixtures that fixtures/make-fixtures.R
 * wrote (versions in each fixture's meta block; spdep 1.2-7, sf 1.0-9, R 4.2.2 for the committed ones).
 * Deterministic quantities to 1e-9 relative; Monte Carlo p-values within a binomial tolerance.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { buildLattice } from "./lattice";
import { toNeighbourList } from "./neighbours";
import { latticeWeights } from "./weights";
import { moranI } from "./moran";
import { gearyC } from "./geary";
import { localMoran } from "./local-moran";
import { getisOrdStar } from "./getis-ord";
import type { LatticeSquare, NeighbourList, NeighbourRule, WeightStyle } from "./types";

interface HTest {
  statistic: number;
  p: number;
  estimate: number[];
  call: string;
}
interface Mc {
  nsim: number;
  statistic: number;
  p: number;
  call: string;
}
interface Block {
  weights: string;
  S0: number;
  S1: number;
  S2: number;
  weightRows: number[][];
  moranRandomisation: HTest;
  moranNormality: HTest;
  moranRandomisationGreater: HTest;
  moranMc: Mc;
  moranMcLess: Mc;
  gearyRandomisation: HTest;
  gearyNormality: HTest;
  gearyMc: Mc;
  localMoran: {
    Ii: number[];
    E: number[];
    Var: number[];
    Z: number[];
    p: number[];
    pGreater: number[];
    pBH: number[];
    quadrant: string[];
  };
  localMoranTotal: { E: number[]; Var: number[]; Z: number[]; p: number[] };
  localGStar: { z: number[]; p: number[] };
  localGStarPermutationMoments: { mean: number[]; variance: number[] };
}
interface Fixture {
  meta: { R: string; packages: Record<string, string>; fixture: string };
  squares: LatticeSquare[];
  neighbours: Record<string, number[][]>;
  tests: Record<string, Block>;
}

const load = (name: string): Fixture =>
  JSON.parse(readFileSync(path.join(import.meta.dirname, "fixtures", `${name}.json`), "utf8"));
const source = (f: Fixture, call: string) =>
  `spdep ${f.meta.packages.spdep} (${f.meta.R.split(" (")[0]}), ${f.meta.fixture}.json: ${call}`;

function closeRel(actual: number, expected: number, rel: number, label: string): void {
  const tol = rel * Math.max(Math.abs(expected), 1e-300);
  expect(Math.abs(actual - expected), `${label}: ${actual} vs ${expected}`).toBeLessThanOrEqual(tol);
}
function arrayRel(actual: ArrayLike<number>, expected: number[], rel: number, label: string, absFloor = 0): void {
  expect(actual.length, label).toBe(expected.length);
  expected.forEach((e, k) => {
    const tol = Math.max(rel * Math.abs(e), absFloor);
    expect(Math.abs(actual[k] - e), `${label} [${k}]: ${actual[k]} vs ${e}`).toBeLessThanOrEqual(tol);
  });
}
/** Normal p-values: 1e-9 relative down to 1e-6; below that jStat's erfc is good to about 1e-3 relative. */
function pClose(actual: number, expected: number, label: string): void {
  closeRel(actual, expected, expected >= 1e-6 ? 1e-9 : 1e-3, label);
}
function nbArrays(nb: NeighbourList): number[][] {
  return Array.from({ length: nb.n }, (_, i) => Array.from(nb.index.subarray(nb.start[i], nb.start[i + 1])));
}
function fromLists(lists: number[][]): NeighbourList {
  return toNeighbourList(lists.map((l) => new Set(l)));
}

/**
 * Binomial tolerance for two Monte Carlo p-values from s permutations each (spdep's and Loamwork's, from
 * different generators): each has sd √(p(1 − p)/(s + 1)), so their difference √(2 p(1 − p)/(s + 1)); allow
 * 4 of those (a correct engine fails one comparison with probability about 6e-5) plus 2/(s + 1) for the
 * two conventions of counting the observed value (spdep ranks with ties averaged, Loamwork counts ≥).
 */
function mcTolerance(p: number, s: number): number {
  const q = Math.min(Math.max(p, 1 / (s + 1)), 0.5);
  return 4 * Math.sqrt((2 * q * (1 - q)) / (s + 1)) + 2 / (s + 1);
}

function checkBlock(f: Fixture, b: Block, values: Float64Array, nb: NeighbourList, style: WeightStyle): void {
  const w = latticeWeights(nb, style);
  const wStar = latticeWeights(nb, style, true);
  const tag = `${f.meta.fixture} / ${b.weights}`;
  // weights and constants: spdep's nb2listw and spweights.constants
  b.weightRows.forEach((row, i) =>
    arrayRel(w.weight.subarray(w.start[i], w.start[i + 1]), row, 1e-12, `${tag} weights row ${i}`),
  );
  closeRel(w.S0, b.S0, 1e-12, `${tag} S0`);
  closeRel(w.S1, b.S1, 1e-12, `${tag} S1`);
  closeRel(w.S2, b.S2, 1e-12, `${tag} S2`);

  // Global Moran's I, moments under randomisation and normality: spdep moran.test
  const m = moranI(values, w, { permutations: 0 });
  closeRel(m.I, b.moranRandomisation.estimate[0], 1e-9, `${tag} I (${source(f, b.moranRandomisation.call)})`);
  closeRel(m.expected, b.moranRandomisation.estimate[1], 1e-12, `${tag} E[I]`);
  closeRel(
    m.variance.randomisation,
    b.moranRandomisation.estimate[2],
    1e-9,
    `${tag} Var_R[I] (${source(f, b.moranRandomisation.call)})`,
  );
  closeRel(
    m.variance.normality,
    b.moranNormality.estimate[2],
    1e-9,
    `${tag} Var_N[I] (${source(f, b.moranNormality.call)})`,
  );
  closeRel(m.z.randomisation, b.moranRandomisation.statistic, 1e-9, `${tag} z_R`);
  closeRel(m.z.normality, b.moranNormality.statistic, 1e-9, `${tag} z_N`);
  pClose(m.p.randomisation, b.moranRandomisation.p, `${tag} p_R two-sided`);
  pClose(m.p.normality, b.moranNormality.p, `${tag} p_N two-sided`);
  pClose(
    moranI(values, w, { permutations: 0, alternative: "positive" }).p.randomisation,
    b.moranRandomisationGreater.p,
    `${tag} p_R greater`,
  );

  // Geary's C: spdep geary.test (its deviate is (1 − C)/sd)
  const g = gearyC(values, w, { permutations: 0 });
  closeRel(g.C, b.gearyRandomisation.estimate[0], 1e-9, `${tag} C (${source(f, b.gearyRandomisation.call)})`);
  closeRel(g.variance.randomisation, b.gearyRandomisation.estimate[2], 1e-9, `${tag} Var_R[C]`);
  closeRel(
    g.variance.normality,
    b.gearyNormality.estimate[2],
    1e-9,
    `${tag} Var_N[C] (${source(f, b.gearyNormality.call)})`,
  );
  closeRel(g.z.randomisation, b.gearyRandomisation.statistic, 1e-9, `${tag} Geary z_R`);
  pClose(g.p.randomisation, b.gearyRandomisation.p, `${tag} Geary p_R`);
  pClose(g.p.normality, b.gearyNormality.p, `${tag} Geary p_N`);

  // Permutation tests, 999 permutations each: spdep moran.mc and geary.mc within the binomial tolerance
  const s = b.moranMc.nsim;
  const mp = moranI(values, w, { permutations: s, alternative: "positive", seed: 7 }).p.permutation!;
  expect(Math.abs(mp - b.moranMc.p), `${tag} Moran permutation p (${source(f, b.moranMc.call)})`).toBeLessThanOrEqual(
    mcTolerance(b.moranMc.p, s),
  );
  const ml = moranI(values, w, { permutations: s, alternative: "negative", seed: 8 }).p.permutation!;
  expect(
    Math.abs(ml - b.moranMcLess.p),
    `${tag} Moran permutation p, less (${source(f, b.moranMcLess.call)})`,
  ).toBeLessThanOrEqual(mcTolerance(b.moranMcLess.p, s));
  const gp = gearyC(values, w, { permutations: s, alternative: "positive", seed: 9 }).p.permutation!;
  expect(Math.abs(gp - b.gearyMc.p), `${tag} Geary permutation p (${source(f, b.gearyMc.call)})`).toBeLessThanOrEqual(
    mcTolerance(b.gearyMc.p, s),
  );

  // Local Moran: spdep localmoran, conditional moments (its default) and total ones
  const lm = localMoran(values, w, { permutations: 0 });
  arrayRel(lm.I, b.localMoran.Ii, 1e-9, `${tag} local I`, 1e-14);
  arrayRel(lm.expected, b.localMoran.E, 1e-9, `${tag} local E (conditional)`, 1e-14);
  arrayRel(lm.variance, b.localMoran.Var, 1e-9, `${tag} local Var (conditional)`, 1e-14);
  arrayRel(lm.z, b.localMoran.Z, 1e-9, `${tag} local z`, 1e-12);
  b.localMoran.p.forEach((p, k) => pClose(lm.pNormal[k], p, `${tag} local p [${k}]`));
  // Benjamini–Hochberg on spdep's normal p: R's p.adjust(p, "BH")
  arrayRel(lm.pAdjusted, b.localMoran.pBH, 1e-9, `${tag} BH-adjusted local p (R p.adjust)`, 1e-15);
  expect(lm.quadrant, `${tag} quadrants (localmoran attr quadr$pysal)`).toEqual(
    b.localMoran.quadrant.map((q) => q.toLowerCase()),
  );
  const lmg = localMoran(values, w, { permutations: 0, alternative: "positive" });
  b.localMoran.pGreater.forEach((p, k) => pClose(lmg.pNormal[k], p, `${tag} local p greater [${k}]`));
  const lmt = localMoran(values, w, { permutations: 0, moments: "total" });
  arrayRel(lmt.expected, b.localMoranTotal.E, 1e-9, `${tag} local E (total)`);
  arrayRel(lmt.variance, b.localMoranTotal.Var, 1e-9, `${tag} local Var (total)`);
  arrayRel(lmt.z, b.localMoranTotal.Z, 1e-9, `${tag} local z (total)`, 1e-12);

  // Gi*: spdep localG on include.self() weights
  const gs = getisOrdStar(values, wStar, { permutations: 0 });
  arrayRel(gs.z, b.localGStar.z, 1e-9, `${tag} Gi* z`, 1e-12);
  b.localGStar.p.forEach((p, k) => pClose(gs.pNormal[k], p, `${tag} Gi* p [${k}]`));
}

const cases: {
  fixture: string;
  block: string;
  neighbours: NeighbourRule | "published";
  style: WeightStyle;
  compareWith: string[];
}[] = [
  {
    fixture: "regular-grid",
    block: "rookBinary",
    neighbours: { type: "rook" },
    style: "binary",
    compareWith: ["rook"],
  },
  { fixture: "regular-grid", block: "queenRow", neighbours: { type: "queen" }, style: "row", compareWith: ["queen"] },
  {
    fixture: "regular-grid",
    block: "band2Binary",
    neighbours: { type: "distance", upper: 2 },
    style: "binary",
    compareWith: ["band2"],
  },
  {
    fixture: "clipped-grid",
    block: "queenRow",
    neighbours: { type: "queen", from: "shapes" },
    style: "row",
    compareWith: ["queenPoly2nb", "queenRelate"],
  },
  {
    fixture: "clipped-grid",
    block: "rookBinary",
    neighbours: { type: "rook", from: "shapes" },
    style: "binary",
    compareWith: ["rookRelate"],
  },
  {
    fixture: "clipped-grid",
    block: "band15Binary",
    neighbours: { type: "distance", upper: 1.5 },
    style: "binary",
    compareWith: ["band15"],
  },
  { fixture: "columbus", block: "published", neighbours: "published", style: "row", compareWith: [] },
  { fixture: "columbus", block: "publishedBinary", neighbours: "published", style: "binary", compareWith: [] },
];

describe("square-count tests against spdep", () => {
  for (const c of cases) {
    it(`${c.fixture}: ${c.block}`, () => {
      const f = load(c.fixture);
      const b = f.tests[c.block];
      let values: Float64Array;
      let nb: NeighbourList;
      if (c.neighbours === "published") {
        values = Float64Array.from(f.squares, (s) => s.value);
        nb = fromLists(f.neighbours.published);
      } else {
        const lat = buildLattice({ squares: f.squares }, { neighbours: c.neighbours });
        expect(lat.ids).toEqual(f.squares.map((s) => s.id));
        values = lat.values;
        nb = lat.neighbours;
        // neighbour lists: spdep dnearneigh on the centres, poly2nb and sf::st_relate on the clipped squares
        for (const name of c.compareWith)
          expect(nbArrays(nb), `${c.fixture} neighbours vs ${name}`).toEqual(f.neighbours[name]);
      }
      checkBlock(f, b, values, nb, c.style);
    });
  }

  it("keeps the clipped grid's density: count / excavated area, squares under the baulk left out (sf::st_intersection)", () => {
    const f = load("clipped-grid");
    const lat = buildLattice({ squares: f.squares });
    expect(Array.from(lat.values)).toEqual(f.squares.map((s) => s.value / s.area));
    // the sliver row along the north edge is 0.2 m deep; squares under the baulk are not in the fixture
    expect(f.squares.find((s) => s.id === "E2 N7")!.area).toBeCloseTo(0.2, 12);
    expect(f.squares.some((s) => s.id === "E3 N2")).toBe(false);
  });
});

describe("conditional permutation against spdep's analytical conditional moments", () => {
  // Under Anselin's conditional permutation (the square's value kept, the others permuted without
  // replacement), the mean and variance of I_i are exactly spdep's localmoran(conditional = TRUE) E.Ii
  // and Var.Ii (Sokal, Oden & Thomson 1998); of the Gi* neighbour sum, spdep's Gi moments without self.
  // With 9,999 permutations the sample mean is within 4.5 standard errors (false alarm about 7e-6 per
  // square); the sample variance's ratio to the exact one has sd about √(2/9999) = 0.014 for a near-normal
  // sum: each square within 1 ± 0.12 (heavier tails allowed), their average within 1 ± 0.02. Drawing with
  // replacement (spdep 1.2-7's localmoran_perm) inflates the variance by (n − 2)/(n − 1 − k), about 1.15
  // with 8 neighbours among 60 squares, and would fail the average.
  const S = 9999;
  for (const [fixture, block, style, rule] of [
    ["regular-grid", "queenRow", "row", { type: "queen" }],
    ["clipped-grid", "rookBinary", "binary", { type: "rook", from: "shapes" }],
  ] as const) {
    it(`${fixture}: ${block}`, () => {
      const f = load(fixture);
      const b = f.tests[block];
      const lat = buildLattice({ squares: f.squares }, { neighbours: rule });
      const w = latticeWeights(lat.neighbours, style);
      const lm = localMoran(lat.values, w, { permutations: S, seed: 5 });
      const ratios: number[] = [];
      b.localMoran.E.forEach((e, i) => {
        const v = b.localMoran.Var[i];
        if (!(v > 0)) return;
        expect(Math.abs(lm.permutationMean[i] - e), `${fixture} square ${i} mean of permuted I_i`).toBeLessThanOrEqual(
          4.5 * Math.sqrt(v / S),
        );
        const r = lm.permutationVariance[i] / v;
        expect(Math.abs(r - 1), `${fixture} square ${i} variance ratio ${r}`).toBeLessThanOrEqual(0.12);
        ratios.push(r);
      });
      expect(Math.abs(ratios.reduce((a, r) => a + r, 0) / ratios.length - 1)).toBeLessThanOrEqual(0.02);

      const wStar = latticeWeights(lat.neighbours, style, true);
      const gs = getisOrdStar(lat.values, wStar, { permutations: S, seed: 6 });
      const gRatios: number[] = [];
      b.localGStarPermutationMoments.mean.forEach((m, i) => {
        const v = b.localGStarPermutationMoments.variance[i];
        let own = 0;
        for (let p = wStar.start[i]; p < wStar.start[i + 1]; p++)
          if (wStar.index[p] === i) own = wStar.weight[p] * lat.values[i];
        expect(
          Math.abs(gs.permutationMean[i] - own - m),
          `${fixture} square ${i} mean of permuted Gi* sum`,
        ).toBeLessThanOrEqual(4.5 * Math.sqrt(v / S));
        const r = gs.permutationVariance[i] / v;
        expect(Math.abs(r - 1), `${fixture} square ${i} Gi* variance ratio ${r}`).toBeLessThanOrEqual(0.12);
        gRatios.push(r);
      });
      expect(Math.abs(gRatios.reduce((a, r) => a + r, 0) / gRatios.length - 1)).toBeLessThanOrEqual(0.02);
    });
  }
});
