/**
 * The one reader of results stored in the shape Loamwork used until December 2026, before the stored result
 * was the engine's own: each test in Loamwork's words (verdict words, a sentence, L curves as L(r) − r) under
 * `tests`, the finds' positions under `points`. Such a result is read into today's shape
 * (lib/api/run-result.ts) so that the workspace shows it as it showed it then, word for word and curve for
 * curve: lib/patterns-view turns the result read here back into the same verdicts, sentences and curves.
 * What the former shape did not keep (the simulated statistics' summary, the band's rank) stays absent.
 * Runs stored before the engine's test descriptions (former-run.ts) had this result shape too.
 *
 * The tests on counts by grid square were stored in Loamwork's words a little longer, under `squareTests`
 * beside either shape: verdict words, a sentence, a question and notes, each square tested with its class
 * words. Those are read here into the engine's result with the squares it was handed, so that
 * lib/patterns-view/square-view.ts gives back the same verdicts, sentences and squares; what they did not keep
 * (the variances and the normal-theory p of a global test, a local test's z and normal p) stays absent.
 */
import { createWindow, type QuadratCellCount, type TestPicture, type TestSpec, type Verdict } from "@/lib/spatial";
import type {
  RunResult,
  SquareUnit,
  StoredCurves,
  StoredSquareResult,
  StoredSquareTest,
  StoredTest,
} from "@/lib/api/run-result";
import type { SquareTestView } from "@/lib/patterns-view/square-view";
import type { RunTest, SquareTest } from "@/lib/schemas/run";
import { engineTest } from "./engine-spec";
import { squareTestSpec } from "./square-tests";

type FormerCurve = {
  r: number[];
  obs: (number | null)[];
  lo?: (number | null)[];
  hi?: (number | null)[];
  theo?: (number | null)[];
};
type FormerDeparture = { side: "above" | "below"; from: number; to: number; rejoins: boolean };
type FormerTest = {
  kind: TestSpec["type"];
  verdict: "clustered" | "regular" | "no-evidence" | "associated" | "segregated";
  sentence: string;
  p: number | null;
  notes: string[];
  n?: number;
  nA?: number;
  nB?: number;
  R?: number;
  z?: number | null;
  meanNN?: number;
  expectedNN?: number;
  histogram?: { edges: number[]; counts: number[] };
  X2?: number;
  df?: number;
  vmr?: number;
  cells?: QuadratCellCount[];
  bandwidth?: number;
  curve?: FormerCurve;
  departures?: FormerDeparture[];
};
/** A square-count test as Loamwork worded it: the workspace's view of it today, field for field. */
type FormerSquareTest = SquareTestView;
type Squares = { squareTests?: (FormerSquareTest | StoredSquareTest)[] };
type FormerTests = Omit<
  RunResult,
  "results" | "finds" | "window" | "points" | "engineVersion" | "seed" | "nsim" | "level" | "squareTests"
> &
  Squares & {
    engineVersion: string;
    seed: number;
    nsim: number;
    level: number;
    area: number;
    tests: FormerTest[];
    points: RunResult["finds"];
  };
type FormerResult = FormerTests | (Omit<RunResult, "squareTests"> & Squares);

const isFormerSquareTest = (t: FormerSquareTest | StoredSquareTest): t is FormerSquareTest => "verdict" in t;

/**
 * A former result lists its tests under `tests` (today's, as the engine does, under `results`), or words its
 * square-count tests itself.
 */
export function isFormerResult(stored: unknown): stored is FormerResult {
  if (typeof stored !== "object" || stored === null) return false;
  const squares = (stored as Squares).squareTests;
  return ("tests" in stored && !("results" in stored)) || (Array.isArray(squares) && squares.some(isFormerSquareTest));
}

const VERDICTS: Record<FormerTest["verdict"], Verdict> = {
  clustered: "clustered",
  regular: "evenly spread",
  associated: "together",
  segregated: "apart",
  "no-evidence": "no evidence against the null",
};

/**
 * The former sentence was the engine's summary less its closing bracket, then "Test: …; null: …[, N
 * simulations]; seed S." The bracket was the test's name after a verdict ("… (p = 0.0100) (Besag's L, MAD
 * test).") and the p-value otherwise ("… level (p = 0.420)."); put back, the sentence reads as it did.
 */
function readSentence(t: FormerTest): { summary: string; test: string; nullName: string; nsim: number | null } {
  const m = /^(.*) Test: (.*); null: (.*?)(?:, (\d+) simulations)?; seed \d+\.$/s.exec(t.sentence);
  if (!m) throw new Error(`A stored ${t.kind} result has a sentence this version cannot read: ${t.sentence}`);
  const [, short = "", test = "", nullName = "", sims] = m;
  const open = short.slice(0, -1);
  const bracket = short.endsWith(").") ? test : `p = ${(t.p ?? NaN).toPrecision(3)}`;
  return { summary: `${open} (${bracket}).`, test, nullName, nsim: sims === undefined ? null : Number(sims) };
}

/** L curves were stored as L(r) − r, to 8 significant digits; plus r gives L back to that precision. */
const plusR = (a: (number | null)[] | undefined, r: number[]): (number | null)[] =>
  (a ?? []).map((v, k) => (v === null || r[k] === undefined ? null : v + r[k]));

function curvesOf(t: FormerTest, spec: TestSpec, nsim: number | null): StoredCurves | undefined {
  const c = t.curve;
  if (!c) return undefined;
  const fun =
    spec.type === "cross-l"
      ? spec.fun
      : spec.type === "l-envelope"
        ? "L"
        : spec.type === "pcf-envelope"
          ? "g"
          : spec.type === "inhomogeneous-l"
            ? "inhomogeneous L"
            : "K difference";
  const minusR = fun === "L" || fun === "inhomogeneous L";
  const back = (a: (number | null)[] | undefined) => (minusR ? plusR(a, c.r) : (a ?? []));
  return {
    statistic: "statistic" in spec ? spec.statistic : "mad",
    pValue: t.p ?? NaN,
    nsim: nsim ?? 0,
    fun,
    r: c.r,
    observed: back(c.obs),
    reference: back(c.theo),
    band: { lo: back(c.lo), hi: back(c.hi) },
    excursions: t.departures ?? [],
  };
}

function detailsOf(t: FormerTest, spec: TestSpec): { details: Record<string, unknown>; picture?: TestPicture } {
  if (spec.type === "clark-evans") {
    const expected = spec.correction === "monte-carlo" ? "meanNNDistanceUnderCsr" : "expectedUnderCsr";
    return {
      details: { R: t.R, z: t.z, meanNNDistance: t.meanNN, [expected]: t.expectedNN, alternative: spec.alternative },
      picture: { kind: "nn-histogram", edges: t.histogram?.edges ?? [], counts: t.histogram?.counts ?? [] },
    };
  }
  if (spec.type === "quadrat") {
    const cells = t.cells ?? [];
    return {
      details: {
        X2: t.X2,
        df: t.df,
        varianceMeanRatio: t.vmr,
        observed: cells.map((c) => c.count),
        expected: cells.map((c) => c.expected),
      },
      picture: { kind: "quadrat-cells", cells },
    };
  }
  return { details: t.bandwidth === undefined ? {} : { bandwidth: t.bandwidth } };
}

const SQUARE_VERDICTS: Record<Exclude<FormerSquareTest["verdict"], "not-run">, StoredSquareResult["verdict"]> = {
  clustered: "clustered",
  dispersed: "dispersed",
  "hot-spots": "hot or cold spots",
  "no-evidence": "no evidence against the null",
};

/** The engine's names for its square-count tests, as its results give them. */
const SQUARE_TEST_NAMES: Record<FormerSquareTest["kind"], string> = {
  moran: "Moran's I",
  geary: "Geary's C",
  "local-moran": "local Moran's I",
  "getis-ord": "Getis–Ord Gi*",
};

/** The run's own caution, put before the engine's: squares dug through unequal numbers of spits or contexts. */
const isDepthCaution = (note: string) =>
  note.startsWith("Squares were dug through different numbers of spits or contexts in this scope");

type LeftOutReason = StoredSquareResult["leftOut"][number]["reason"];

/**
 * A square as the test was handed it, from a square it drew. The engine was handed the class's count; a
 * density test kept an integer count over the area dug, so the count is that density times the area,
 * rounded (and dividing again gives the density back exactly).
 */
function unitOf(c: FormerSquareTest["cells"][number], variable: FormerSquareTest["variable"]): SquareUnit {
  const count = variable === "density" ? Math.round(c.value * c.area) : c.value;
  return { label: c.label, x0: c.x0, y0: c.y0, x1: c.x1, y1: c.y1, area: c.area, count };
}

/**
 * The former square-count tests, one for each asked-for test and class in scope in that order, read into the
 * engine's result; the spec is the one the run gave the engine (its permutations and seed as stored).
 */
function readFormerSquareTests(
  stored: (FormerSquareTest | StoredSquareTest)[],
  asked: SquareTest[],
  classes: number,
  level: number,
): StoredSquareTest[] {
  return stored.map((t, k): StoredSquareTest => {
    if (!isFormerSquareTest(t)) return t;
    const own = asked[Math.floor(k / Math.max(1, classes))];
    if (!own || own.type !== t.kind)
      throw new Error(`A stored result's square test ${k + 1} (${t.kind}) does not match the run's square tests.`);
    const spec = squareTestSpec({ ...own, style: t.style, variable: t.variable }, t.gridSize, {
      permutations: t.permutations,
      seed: t.seed,
      level,
    });
    const kept = { classId: t.classId, gridSize: t.gridSize };
    if (t.verdict === "not-run") return { ...kept, spec, n: t.n, refused: t.notes[0] ?? t.sentence };
    const m = /^(.*) Null: (.*); seed \d+\.$/s.exec(t.sentence);
    if (!m) throw new Error(`A stored ${t.kind} result has a sentence this version cannot read: ${t.sentence}`);
    const [, summary = "", nullName = ""] = m;
    const local = t.kind === "local-moran" || t.kind === "getis-ord";
    const result: StoredSquareResult = {
      spec,
      test: SQUARE_TEST_NAMES[t.kind],
      nullName,
      verdict: SQUARE_VERDICTS[t.verdict],
      summary,
      cautions: t.notes.filter((n) => !isDepthCaution(n)),
      n: t.n,
      leftOut: t.leftOut.map((l) => ({ id: l.label, reason: l.reason as LeftOutReason })),
      neighbours: t.neighbours,
      p: t.p ?? NaN,
      pFrom: t.pFrom ?? "permutation",
      ...(local
        ? {
            squares: t.cells.map((c) => ({
              id: c.label,
              value: c.value,
              statistic: c.statistic ?? NaN,
              p: c.p ?? NaN,
              pAdjusted: c.pAdjusted ?? NaN,
              class: c.class,
            })),
          }
        : { global: { statistic: t.statistic ?? NaN, expected: t.expected ?? NaN, z: { randomisation: t.z ?? NaN } } }),
    };
    return {
      ...kept,
      units: t.cells.map((c) => unitOf(c, t.variable)),
      result,
      cautions: t.notes.filter(isDepthCaution),
    };
  });
}

/** A former result in today's shape; `tests` and `squareTests` are what the run asked for, as stored. */
export function readFormerResult(former: FormerResult, tests: RunTest[], squareTests: SquareTest[]): RunResult {
  const { squareTests: squares, ...rest } = former;
  const run = "tests" in rest ? readFormerTests(rest, tests) : rest;
  return squares
    ? { ...run, squareTests: readFormerSquareTests(squares, squareTests, run.classes.length, run.level) }
    : run;
}

function readFormerTests(former: Omit<FormerTests, "squareTests">, tests: RunTest[]): RunResult {
  const { tests: old, points, area, ...run } = former;
  const codes = new Map(former.classes.map((c) => [c.id, c.code]));
  const code = (id: string) => codes.get(id) ?? id;
  const results = old.map((t, i): StoredTest => {
    const own = tests[i];
    if (!own || own.type !== t.kind)
      throw new Error(`A stored result's test ${i + 1} (${t.kind}) does not match the run's tests.`);
    const spec = engineTest(own, code);
    const { summary, test, nullName, nsim } = readSentence(t);
    return {
      type: t.kind,
      test,
      null: nullName,
      options: spec,
      verdict: VERDICTS[t.verdict],
      summary,
      pValue: t.p ?? NaN,
      level: former.level,
      nsim,
      seed: former.seed,
      n: t.n ?? (t.nA ?? 0) + (t.nB ?? 0),
      ...detailsOf(t, spec),
      curves: curvesOf(t, spec, nsim),
      cautions: t.notes,
    };
  });
  const [outer = [], ...holes] = former.outline;
  const window = createWindow({ outer, holes });
  return {
    ...run,
    window: { area, perimeter: window.perimeter, holes: holes.length },
    points: points.reduce((s, p) => s + p.x.length, 0),
    results,
    finds: points,
  };
}
