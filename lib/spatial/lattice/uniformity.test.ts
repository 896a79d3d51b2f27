/**
 * Under the null the tests hold their level: counts placed on the squares at random (a seeded random
 * permutation of one invented set of counts, ties and zeros included) give p-values uniform on (0, 1].
 * The bounds are binomial: with R independent replicates and level 0.05 the number of rejections is
 * Binomial(R, 0.05) (Besag & Diggle 1977: the permutation p-value is exactly uniform under
 * exchangeability, conservative with ties). Each assertion's false-alarm rate, for a correct engine and
 * a seed chosen at random, is stated beside it; the seeds here are fixed, so the test is deterministic.
 */
import { describe, expect, it } from "vitest";
import { createRandom } from "../random/random";
import { gridContiguity } from "./neighbours";
import { latticeWeights } from "./weights";
import { moranI } from "./moran";
import { gearyC } from "./geary";
import { localMoran } from "./local-moran";
import { getisOrdStar } from "./getis-ord";

const NX = 10;
const NY = 8;
const cells = Array.from({ length: NX * NY }, (_, k) => ({ id: `s${k}`, col: k % NX, row: Math.floor(k / NX) }));
const queen = gridContiguity(cells, "queen");
// Invented counts: skewed, with zeros and many ties, as sieved debitage per square tends to be.
const base = Float64Array.from(
  { length: NX * NY },
  (_, k) => [0, 0, 1, 2, 2, 3, 5, 8, 13, 4][k % 10] + (k % 7 === 0 ? 20 : 0),
);

function shuffled(rep: number): Float64Array {
  const v = base.slice();
  const rng = createRandom(2026, rep);
  for (let i = v.length - 1; i > 0; i--) {
    const j = rng.int(i + 1);
    [v[i], v[j]] = [v[j], v[i]];
  }
  return v;
}

/** χ² of ten equal bins of the p-values against uniform. */
function decileChiSquare(ps: number[]): number {
  const bins = new Array(10).fill(0);
  for (const p of ps) bins[Math.min(9, Math.floor(p * 10 - 1e-12))]++;
  const e = ps.length / 10;
  return bins.reduce((s, o) => s + (o - e) ** 2 / e, 0);
}

describe("p-values under random placement of the counts", () => {
  it("global Moran's I and Geary's C: permutation and randomisation p-values uniform (400 replicates)", () => {
    const R = 400;
    const w = latticeWeights(queen, "row");
    const pm: number[] = [];
    const pr: number[] = [];
    const pg: number[] = [];
    for (let rep = 0; rep < R; rep++) {
      const x = shuffled(rep);
      const m = moranI(x, w, { permutations: 199, seed: rep });
      pm.push(m.p.permutation!);
      pr.push(m.p.randomisation);
      pg.push(gearyC(x, w, { permutations: 199, seed: 10_000 + rep }).p.permutation!);
    }
    // Rejections at 0.05 within 8..33 of 400: false alarm 0.0027 each (Binomial(400, 0.05) tails).
    for (const [name, ps] of [
      ["Moran permutation", pm],
      ["Moran randomisation", pr],
      ["Geary permutation", pg],
    ] as const) {
      const rejections = ps.filter((p) => p <= 0.05).length;
      expect(rejections, `${name}: ${rejections} of ${R} at 0.05`).toBeGreaterThanOrEqual(8);
      expect(rejections, `${name}: ${rejections} of ${R} at 0.05`).toBeLessThanOrEqual(33);
    }
    // Deciles: χ² with 9 df below its 0.999 quantile 27.88 (false alarm 0.001 each). The permutation
    // p-values take values k/200, which the bins of width 0.1 split evenly.
    expect(decileChiSquare(pm)).toBeLessThan(27.88);
    expect(decileChiSquare(pg)).toBeLessThan(27.88);
  });

  it("local Moran and Gi*: conditional permutation p-values of one square uniform (300 replicates)", () => {
    const R = 300;
    const w = latticeWeights(queen, "binary");
    const wStar = latticeWeights(queen, "binary", true);
    const corner = 0;
    const inner = 3 * NX + 4;
    const got: Record<string, number[]> = {
      "local Moran, corner": [],
      "local Moran, inner": [],
      "Gi*, corner": [],
      "Gi*, inner": [],
    };
    for (let rep = 0; rep < R; rep++) {
      const x = shuffled(50_000 + rep);
      const lm = localMoran(x, w, { permutations: 199, seed: rep });
      const gs = getisOrdStar(x, wStar, { permutations: 199, seed: rep });
      got["local Moran, corner"].push(lm.pPermutation![corner]);
      got["local Moran, inner"].push(lm.pPermutation![inner]);
      got["Gi*, corner"].push(gs.pPermutation![corner]);
      got["Gi*, inner"].push(gs.pPermutation![inner]);
    }
    // Rejections at 0.05 within 6..27 of 300 (false alarm 0.0036 each): with ties the test is
    // conservative, so the lower bound is the one that ties could break; these counts tie less than that.
    for (const [name, ps] of Object.entries(got)) {
      const rejections = ps.filter((p) => p <= 0.05).length;
      expect(rejections, `${name}: ${rejections} of ${R}`).toBeGreaterThanOrEqual(6);
      expect(rejections, `${name}: ${rejections} of ${R}`).toBeLessThanOrEqual(27);
    }
  });

  it("the false-discovery-rate adjustment keeps chance hot spots rare where raw p-values find many", () => {
    // 100 random placements, Gi* with the normal p (no permutations, to reach the small p-values the
    // adjustment needs across 80 squares). Unadjusted, most placements show some square at p ≤ 0.05;
    // adjusted (Benjamini & Hochberg 1995), under this complete null the share with any is at most about
    // 0.05: allowed up to 10 of 100 (Binomial(100, 0.05) exceeds 9 with probability 0.028).
    const wStar = latticeWeights(queen, "binary", true);
    let anyRaw = 0;
    let anyAdjusted = 0;
    for (let rep = 0; rep < 100; rep++) {
      const gs = getisOrdStar(shuffled(90_000 + rep), wStar, { permutations: 0 });
      if (gs.pNormal.some((p) => p <= 0.05)) anyRaw++;
      if (gs.pAdjusted.some((p) => p <= 0.05)) anyAdjusted++;
    }
    expect(anyRaw).toBeGreaterThan(60);
    expect(anyAdjusted).toBeLessThanOrEqual(10);
  });
});
