import type { TestKind } from "@/lib/schemas/run";

/**
 * Fewest finds per class a test accepts. Loamwork refuses below these (common practice: with so few points
 * a Monte Carlo test has almost no power and the curves are mostly noise); statistics.md asks for a caution
 * below about 20, which the result shows separately.
 */
export const MIN_POINTS: Record<TestKind, number> = {
  "clark-evans": 5,
  quadrat: 10,
  "l-envelope": 10,
  "pcf-envelope": 10,
  "cross-l": 5,
  "k-difference": 5,
  "inhomogeneous-l": 10,
};

/** Below this n, statistics.md's few-points caution applies. */
export const LOW_POWER_N = 20;

export const TEST_NAMES: Record<TestKind, string> = {
  "clark-evans": "Clark–Evans nearest-neighbour test",
  quadrat: "Quadrat counts",
  "l-envelope": "Besag's L with a global envelope test under CSR",
  "pcf-envelope": "Pair correlation g(r)",
  "cross-l": "Cross-L between two classes",
  "k-difference": "K difference (K_AA − K_BB) under random labelling",
  "inhomogeneous-l": "Inhomogeneous L against the density of finds",
};

/** The refusal sentence for a class with too few finds. */
export function tooFewMessage(kind: TestKind, code: string, n: number): string {
  return `${TEST_NAMES[kind]} needs at least ${MIN_POINTS[kind]} finds of ${code} in the scope; there ${n === 1 ? "is" : "are"} ${n}.`;
}
