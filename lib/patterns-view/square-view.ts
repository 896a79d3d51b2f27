/**
 * A stored square-count test (lib/api/run-result.ts: the engine's result with the squares it was handed) as
 * the workspace, its map and the printed outputs show it: the verdict in plain words, the sentence a
 * specialist can quote, the question the test answered, its cautions, and each square tested placed on the
 * plan with its value, its local statistic and its class words. Pure functions of the stored result: safe
 * for client components and for the server alike.
 */
import type {
  ClassInScope,
  PlacedSquare,
  RunResult,
  SquareUnit,
  StoredSquareResult,
  StoredSquareTest,
} from "@/lib/api/run-result";
import type { SquareClass, SquareTestSpec, SquareVerdict } from "@/lib/spatial";

/** Verdict of a square-count test: like values together, high and low alternating, hot or cold spots found. */
export type SquareVerdictWord = "clustered" | "dispersed" | "hot-spots" | "no-evidence" | "not-run";
/** A square's class in a local test, after the false-discovery-rate adjustment (the engine's own words). */
export type SquareClassWord = SquareClass;

/** One square of the grid in a square-count result, placed on the plan (its whole square, x0..x1, y0..y1). */
export type SquareCellView = PlacedSquare & {
  /** Excavated m² used, and the variable tested (density per m² or count). */
  area: number;
  value: number;
  /** Local tests: local I_i or Gi* (a z-score), the permutation p and the false-discovery-rate adjusted p. */
  statistic: number | null;
  p: number | null;
  pAdjusted: number | null;
  class: SquareClassWord;
};

/** A test on counts by grid square, for one class, as the workspace shows it. */
export type SquareTestView = {
  kind: SquareTestSpec["type"];
  classId: string;
  verdict: SquareVerdictWord;
  /** One sentence a specialist can quote, naming the test, p, the permutations and the seed. */
  sentence: string;
  p: number | null;
  pFrom: "permutation" | "randomisation" | "normal" | null;
  question: string;
  notes: string[];
  /** Squares tested, and those left out with the reason. */
  n: number;
  leftOut: { label: string; reason: string }[];
  neighbours: string;
  style: "row" | "binary";
  variable: "density" | "count";
  permutations: number;
  seed: number;
  /** Global tests: the statistic and its expectation under the null. */
  statistic: number | null;
  expected: number | null;
  z: number | null;
  gridSize: number;
  cells: SquareCellView[];
};

/** What each square-count test asks, in words a specialist can put in a report. */
export const SQUARE_QUESTIONS: Record<SquareTestSpec["type"], string> = {
  moran:
    "Do squares with similar counts lie next to each other more than if the counts were placed over the dug squares at random (Moran's I)?",
  geary:
    "Do neighbouring squares differ less (or more) in their counts than if the counts were placed at random (Geary's C, which weighs differences between neighbours)?",
  "local-moran":
    "Which squares sit among neighbours like themselves (high among high, low among low), or stand out from them, more than chance placement allows (local Moran's I)?",
  "getis-ord":
    "Where are the hot and cold spots: squares whose neighbourhood, the square included, holds more or fewer finds than chance placement allows (Getis–Ord Gi*)?",
};

const VERDICT_WORDS: Record<SquareVerdict, SquareVerdictWord> = {
  clustered: "clustered",
  dispersed: "dispersed",
  "hot or cold spots": "hot-spots",
  "no evidence against the null": "no-evidence",
};

/** The engine's verdict on squares as the workspace words it. */
export const squareVerdictWord = (v: SquareVerdict): SquareVerdictWord => VERDICT_WORDS[v] ?? "no-evidence";

/** A number as stored, or null where there is none (JSON keeps a NaN as null; a former result may lack it). */
const num = (v: number | null | undefined): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);

/** The sentence to quote: the engine's summary, then its null and the seed. */
export const squareSentenceOf = (r: StoredSquareResult): string =>
  `${r.summary} Null: ${r.nullName}; seed ${r.spec.seed}.`;

/**
 * The squares a test read, placed on the plan: for a local test each square the engine gives a row for, with
 * its statistic, p-values and class; for a global test every square handed to it and not left out, with the
 * variable it tested (finds per m² dug, or the count).
 */
export function squareCellViews(units: readonly SquareUnit[], r: StoredSquareResult): SquareCellView[] {
  const byLabel = new Map(units.map((u) => [u.label, u]));
  const cell = (
    label: string,
    value: number,
    local?: Pick<SquareCellView, "statistic" | "p" | "pAdjusted" | "class">,
  ): SquareCellView => {
    const u = byLabel.get(label);
    if (!u) throw new Error(`A stored square-count result names square ${label}, which it was not handed.`);
    const { x0, y0, x1, y1, area } = u;
    return { label, x0, y0, x1, y1, area, value, statistic: null, p: null, pAdjusted: null, class: "none", ...local };
  };
  if (r.squares)
    return r.squares.map((q) =>
      cell(q.id, q.value, { statistic: num(q.statistic), p: num(q.p), pAdjusted: num(q.pAdjusted), class: q.class }),
    );
  const leftOut = new Set(r.leftOut.map((l) => l.id));
  return units
    .filter((u) => !leftOut.has(u.label))
    .map((u) => cell(u.label, r.spec.variable === "density" ? u.count / u.area : u.count));
}

/** One stored square-count test as the workspace shows it; `code` names a class by its record id. */
export function squareTestView(t: StoredSquareTest, code: (classId: string) => string): SquareTestView {
  const spec = "refused" in t ? t.spec : t.result.spec;
  const base = {
    kind: spec.type,
    classId: t.classId,
    question: SQUARE_QUESTIONS[spec.type],
    style: spec.style,
    variable: spec.variable,
    permutations: spec.permutations,
    seed: spec.seed,
    gridSize: t.gridSize,
  };
  if ("refused" in t)
    return {
      ...base,
      verdict: "not-run",
      sentence: `Not run for ${code(t.classId)}: ${t.refused}`,
      p: null,
      pFrom: null,
      notes: [t.refused],
      n: t.n,
      leftOut: [],
      neighbours: "",
      statistic: null,
      expected: null,
      z: null,
      cells: [],
    };
  const r = t.result;
  return {
    ...base,
    verdict: squareVerdictWord(r.verdict),
    sentence: squareSentenceOf(r),
    p: num(r.p),
    pFrom: r.pFrom,
    notes: [...t.cautions, ...r.cautions],
    n: r.n,
    leftOut: r.leftOut.map((l) => ({ label: l.id, reason: l.reason })),
    neighbours: r.neighbours,
    statistic: num(r.global?.statistic),
    expected: num(r.global?.expected),
    z: num(r.global?.z.randomisation),
    cells: squareCellViews(t.units, r),
  };
}

/** Each stored square-count test as the workspace shows it, in the run's order (none when it asked for none). */
export function squareTestViews(run: Pick<RunResult, "squareTests" | "classes">): SquareTestView[] {
  const codes = new Map(run.classes.map((c: ClassInScope) => [c.id, c.code]));
  return (run.squareTests ?? []).map((t) => squareTestView(t, (id) => codes.get(id) ?? "?"));
}
