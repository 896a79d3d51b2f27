/**
 * Verdicts and cautions of the square-count tests, in the words of the point tests (run/run-verdict.ts,
 * run/run-cautions.ts) and of statistics.md ("Cautions on every lattice result").
 */
import type { Lattice } from "./types";
import type { SquareTestSpec } from "./square-test-spec";

export type SquareVerdict = "clustered" | "dispersed" | "hot or cold spots" | "no evidence against the null";
/** A square's class in a local test, after the false-discovery-rate adjustment. */
export type SquareClass = "hot spot" | "cold spot" | "high among low" | "low among high" | "none";

export const SQUARE_NULL = "spatial randomness (the values permuted over the squares)";

export const LATTICE_CAUTIONS = [
  "A hot spot is a place, not a process: squares rich in finds do not say how the finds came to be there (equifinality).",
  "The answer depends on the square size and the grid's origin (the modifiable areal unit problem): another grid over the same finds may give another result.",
  "Mixing contexts mixes moments in time: counts summed over several deposits may show a pattern that no single deposit has.",
];

const pct = (level: number) => `${Math.round(level * 1000) / 10} %`;

export function globalVerdict(
  test: string,
  p: number,
  level: number,
  positive: boolean,
  statistic: string,
): { verdict: SquareVerdict; summary: string } {
  const at = `at the ${pct(level)} level (p = ${p.toPrecision(3)})`;
  if (p > level)
    return {
      verdict: "no evidence against the null",
      summary: `No evidence against ${SQUARE_NULL} ${at}; ${statistic}.`,
    };
  return positive
    ? {
        verdict: "clustered",
        summary: `Squares with similar values lie together (positive spatial autocorrelation) ${at}; ${statistic} (${test}).`,
      }
    : {
        verdict: "dispersed",
        summary: `High and low squares alternate more than chance would have it (negative spatial autocorrelation) ${at}; ${statistic} (${test}).`,
      };
}

export function localSummary(test: string, classes: SquareClass[], rawSignificant: number, level: number): string {
  const count = (c: SquareClass) => classes.filter((k) => k === c).length;
  const hot = count("hot spot");
  const cold = count("cold spot");
  const outliers = count("high among low") + count("low among high");
  const parts = [`${hot} hot spot${hot === 1 ? "" : "s"}`, `${cold} cold spot${cold === 1 ? "" : "s"}`];
  if (test === "local Moran's I")
    parts.push(`${outliers} outlier${outliers === 1 ? "" : "s"} (a high square among low ones or the reverse)`);
  return `${test}: ${parts.join(", ")} among ${classes.length} squares after the false-discovery-rate adjustment at the ${pct(level)} level (${rawSignificant} before it).`;
}

export function squareCautions(spec: SquareTestSpec, lattice: Lattice, local: boolean): string[] {
  const out = [...LATTICE_CAUTIONS];
  const n = lattice.ids.length;
  if (local) {
    out.push(
      `With ${n} squares, some local tests come out "significant" by chance: the hot and cold spots shown are those left after the Benjamini–Hochberg false-discovery-rate adjustment across squares; the unadjusted p-values are shown for reference only.`,
    );
  }
  if (local && spec.permutations > 0) {
    const sides = spec.alternative === "two-sided" ? 2 : 1;
    const floor = sides / (spec.permutations + 1);
    if (floor * n > spec.level) {
      const needed = Math.ceil((sides * n) / spec.level) - 1;
      out.push(
        `With ${spec.permutations} permutations the smallest p-value a square can reach is ${floor.toPrecision(2)}, too coarse for the adjustment across ${n} squares to leave a lone hot or cold spot (it needs p ≤ ${(spec.level / n).toPrecision(2)}): use at least ${needed} permutations.`,
      );
    }
  }
  if (n < 30)
    out.push(`Only ${n} squares: the test has little power, and 'no evidence' is not evidence of randomness.`);
  if (lattice.variable === "density") {
    out.push(
      "Edge squares: tested as density (the count over the area dug inside the outline and holes, summed over the spits or contexts in scope), so squares cut by the outline or only partly dug stand beside whole ones; a small square's density rests on few finds and varies more. The weights are not scaled by area: Moran's I, Geary's C and Gi* give every square the same weight.",
    );
  } else {
    out.push(
      "Tested as raw counts: where squares differ in excavated area, counts mix the finds' spread with the area dug — prefer density.",
    );
  }
  const rule = lattice.rule;
  if (rule.type !== "distance" && rule.from === "shapes")
    out.push(
      "Neighbours from the squares as the outline and holes cut them: two squares that no longer share an edge (or, for queen, a corner) after the cut are not neighbours, even when they are next to each other on the grid.",
    );
  else if (rule.type === "distance")
    out.push(
      "Distances are measured between the squares' centres as given; for a square cut by the outline, the centroid of the part inside.",
    );
  const lost = lattice.leftOut.length;
  if (lost > 0) {
    const why = [...new Set(lattice.leftOut.map((l) => l.reason))].join(", ");
    out.push(`${lost} square${lost === 1 ? " was" : "s were"} left out (${why}).`);
  }
  if (spec.style === "row")
    out.push("Row-standardised weights: a square at the edge, with fewer neighbours, gives each of them more weight.");
  return out;
}
