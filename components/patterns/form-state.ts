import type { RunCreateInput, RunTest, RunTestInput, SquareTest, SquareTestKind } from "@/lib/schemas/run";

/** The workspace form: scope, tests with their options, shared parameters. Every default is changeable. */
export type FormState = {
  trenchId: string;
  contextIds: string[];
  classIds: string[];
  /** Depth limits: a range of reduced levels (m above the site datum, as typed) and chosen spits. */
  levelFrom: string;
  levelTo: string;
  spitIds: string[];
  clarkEvans: {
    on: boolean;
    correction: "none" | "donnelly" | "monte-carlo";
    alternative: "two-sided" | "clustered" | "regular";
  };
  quadrat: { on: boolean; cellSize: string };
  lcsr: { on: boolean; statistic: "mad" | "dclf" | "rank"; count: "fixed" | "poisson" };
  pcf: { on: boolean };
  cross: { on: boolean; a: string; b: string; null: "random-labelling" | "a-fixed"; fun: "L" | "K" };
  kdiff: { on: boolean; a: string; b: string };
  inhom: { on: boolean; classId: string; reference: string };
  /** Tests on counts by grid square: which ones, and their neighbours, weights, variable and minimum area. */
  squares: {
    kinds: SquareTestKind[];
    /** Rook and queen between the squares as the trench cuts them; a distance band of 1.5 squares. */
    neighbours: "queen" | "rook" | "distance";
    style: SquareTest["style"];
    variable: SquareTest["variable"];
    minArea: string;
  };
  correction: "isotropic" | "translation" | "border";
  rmax: string;
  nsim: string;
  level: string;
  seed: string;
};

export function initialForm(trenchId: string): FormState {
  return {
    trenchId,
    contextIds: [],
    classIds: [],
    levelFrom: "",
    levelTo: "",
    spitIds: [],
    clarkEvans: { on: true, correction: "monte-carlo", alternative: "two-sided" },
    quadrat: { on: false, cellSize: "1" },
    lcsr: { on: true, statistic: "mad", count: "fixed" },
    pcf: { on: false },
    cross: { on: false, a: "", b: "", null: "random-labelling", fun: "L" },
    kdiff: { on: false, a: "", b: "" },
    inhom: { on: false, classId: "", reference: "all" },
    squares: { kinds: [], neighbours: "queen", style: "row", variable: "density", minArea: "0" },
    correction: "isotropic",
    rmax: "",
    nsim: "999",
    level: "0.05",
    seed: "",
  };
}

/** A typed level as a number when it is a plain decimal; otherwise as typed, so the server names the field. */
const typedLevel = (s: string): unknown => (/^-?\d+(\.\d+)?$/.test(s.trim()) ? Number(s.trim()) : s.trim());

/**
 * The request body the run API takes (lib/schemas/run.ts): the engine's test descriptions, one for each
 * chosen class where a test studies one class, each with the options the form shows and Loamwork's fixed
 * choices for the rest (the between-class and g tests use the DCLF statistic with n fixed).
 */
export function toRequest(f: FormState): RunCreateInput {
  const tests: RunTestInput[] = [];
  const each = (make: (classId: string) => RunTestInput) => f.classIds.forEach((c) => tests.push(make(c)));
  // The engine's between-class estimators offer isotropic and translation; border falls back to isotropic.
  const pair = f.correction === "translation" ? "translation" : "isotropic";
  const { clarkEvans: ce, lcsr } = f;
  if (ce.on) each((c) => ({ type: "clark-evans", class: c, correction: ce.correction, alternative: ce.alternative }));
  if (f.quadrat.on) each((c) => ({ type: "quadrat", class: c, cellSize: Number(f.quadrat.cellSize) }));
  if (lcsr.on)
    each((c) => ({
      type: "l-envelope",
      class: c,
      statistic: lcsr.statistic,
      count: lcsr.count,
      correction: f.correction,
    }));
  if (f.pcf.on) each((c) => ({ type: "pcf-envelope", class: c, count: "fixed", statistic: "dclf" }));
  if (f.cross.on) {
    const { a, b, null: nul, fun } = f.cross;
    tests.push({ type: "cross-l", a, b, null: nul, fun, count: "fixed", correction: pair, statistic: "dclf" });
  }
  if (f.kdiff.on) tests.push({ type: "k-difference", a: f.kdiff.a, b: f.kdiff.b, correction: pair, statistic: "dclf" });
  if (f.inhom.on)
    tests.push({
      type: "inhomogeneous-l",
      class: f.inhom.classId,
      ...(f.inhom.reference !== "all" && { reference: f.inhom.reference }),
      statistic: "dclf",
    });
  const { kinds, neighbours, style, variable, minArea } = f.squares;
  const squareTests = kinds.map((type) => ({
    type,
    neighbours: neighbours === "distance" ? { type: neighbours } : { type: neighbours, from: "shapes" as const },
    style,
    variable,
    minArea: Number(minArea) || 0,
  }));
  return {
    scope: {
      trenchId: f.trenchId,
      contextIds: f.contextIds,
      classIds: f.classIds,
      ...(f.levelFrom.trim() && { levelFrom: typedLevel(f.levelFrom) }),
      ...(f.levelTo.trim() && { levelTo: typedLevel(f.levelTo) }),
      ...(f.spitIds.length && { spitIds: f.spitIds }),
    },
    tests,
    ...(squareTests.length && { squareTests }),
    params: {
      nsim: Number(f.nsim),
      level: Number(f.level),
      ...(f.rmax.trim() && { rmax: Number(f.rmax) }),
      ...(f.seed.trim() && { seed: Number(f.seed) }),
    },
  };
}

/** A saved run's settings back in the form (same seed), to run it again on today's records. */
export function formFromRun(run: {
  scope: {
    trenchId: string;
    contextIds: string[];
    classIds: string[];
    levelFrom?: number;
    levelTo?: number;
    spitIds?: string[];
  };
  seed: number;
  params: {
    /** Former-shape runs only; a run's tests carry their own correction. */
    correction?: FormState["correction"];
    rmax: number;
    nsim: number;
    level: number;
    tests: RunTest[];
    squareTests?: SquareTest[];
  };
}): FormState {
  const f = initialForm(run.scope.trenchId);
  f.contextIds = [...run.scope.contextIds];
  f.classIds = [...run.scope.classIds];
  f.levelFrom = run.scope.levelFrom === undefined ? "" : String(run.scope.levelFrom);
  f.levelTo = run.scope.levelTo === undefined ? "" : String(run.scope.levelTo);
  f.spitIds = [...(run.scope.spitIds ?? [])];
  f.clarkEvans.on = f.lcsr.on = false;
  let correction = run.params.correction;
  for (const t of run.params.tests) {
    if (t.type === "clark-evans") f.clarkEvans = { on: true, correction: t.correction, alternative: t.alternative };
    if (t.type === "quadrat") f.quadrat = { on: true, cellSize: String(t.cellSize ?? 1) };
    if (t.type === "l-envelope") {
      f.lcsr = { on: true, statistic: t.statistic, count: t.count };
      correction ??= t.correction;
    }
    if (t.type === "pcf-envelope") f.pcf = { on: true };
    if (t.type === "cross-l") f.cross = { on: true, a: t.a, b: t.b, null: t.null, fun: t.fun };
    if (t.type === "k-difference") f.kdiff = { on: true, a: t.a, b: t.b };
    if (t.type === "inhomogeneous-l") f.inhom = { on: true, classId: t.class ?? "", reference: t.reference ?? "all" };
  }
  // The pair tests know isotropic and translation only; with no L test they name the run's correction.
  for (const t of run.params.tests) if (t.type === "cross-l" || t.type === "k-difference") correction ??= t.correction;
  const sq = run.params.squareTests ?? [];
  if (sq.length)
    f.squares = {
      kinds: sq.map((t) => t.type),
      neighbours: sq[0]!.neighbours.type,
      style: sq[0]!.style,
      variable: sq[0]!.variable,
      minArea: String(sq[0]!.minArea),
    };
  return {
    ...f,
    correction: correction ?? "isotropic",
    rmax: String(run.params.rmax),
    nsim: String(run.params.nsim),
    level: String(run.params.level),
    seed: String(run.seed),
  };
}

const TEST_WORDS: [keyof FormState, string][] = [
  ["lcsr", "Besag's L"],
  ["clarkEvans", "Clark–Evans"],
  ["quadrat", "quadrat counts"],
  ["pcf", "pair correlation"],
  ["cross", "cross-L"],
  ["kdiff", "K difference"],
  ["inhom", "inhomogeneous L"],
];

/** What a run of the form as it stands will do, in one line, for the folded settings. */
export function describeChoices(f: FormState): string {
  const on = TEST_WORDS.filter(([k]) => (f[k] as { on: boolean }).on).map(([, w]) => w);
  const squares = f.squares.kinds.length;
  if (squares) on.push(`${squares} test${squares === 1 ? "" : "s"} by square`);
  const tests = on.length ? on.join(", ") : "no test chosen";
  const level = Number(f.level);
  const at = Number.isFinite(level) && level > 0 ? `${Math.round(level * 1000) / 10} % level` : `level ${f.level}`;
  const seed = f.seed.trim() ? `seed ${f.seed.trim()}` : "a new seed";
  const rmax = f.rmax.trim() ? `r up to ${f.rmax.trim()} m` : "r up to a quarter of the short side";
  return `${tests}; ${f.nsim} simulations, ${at}, ${f.correction} edge correction, ${rmax}, ${seed}.`;
}

/** Whether the tests and settings differ from the defaults (the folded part then opens, so nothing hides). */
export function differsFromDefaults(f: FormState): boolean {
  const d = initialForm(f.trenchId);
  const strip = ({ trenchId: _t, contextIds: _c, classIds: _k, ...rest }: FormState) => JSON.stringify(rest);
  return strip(f) !== strip(d);
}
