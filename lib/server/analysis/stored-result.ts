/**
 * The result a run stores: the engine's own result as it gave it (lib/api/run-result.ts), with what the
 * workspace draws around it: the classes in scope, the trench outline, where the finds lie, the heat layers.
 * Reading a stored result goes through `readStoredResult`, which reads older shapes with former-result.ts.
 */
import type { RunResult as EngineResult, Window } from "@/lib/spatial";
import type { SpecClass, SpecFind } from "./engine-spec";
import { kernelDensity, type Pts } from "./plot-data";
import type { AnalysisRun } from "@/db/schema";
import type { ClassInScope, RunResult } from "@/lib/api/run-result";
import type { RunParamsStored } from "@/lib/api/patterns-responses";
import { readRunTests, readSquareTests } from "@/lib/schemas/former-run";
import type { Correction, RunScope, RunTest, SquareTest } from "@/lib/schemas/run";
import { isFormerResult, readFormerResult } from "./former-result";

/** The edge correction the run's curves used, shown with the result: its L test's, else its first curve test's. */
function correctionOf(tests: RunTest[]): Correction {
  const l = tests.find((t) => t.type === "l-envelope");
  if (l) return l.correction;
  for (const t of tests) if ("correction" in t && t.type !== "clark-evans") return t.correction;
  return "isotropic";
}

export type StoredResultInput = {
  engine: EngineResult;
  /** The run's tests as stored (class ids), one for each of the engine's results. */
  tests: RunTest[];
  window: Window;
  classes: (SpecClass & { label: string; colour: string; symbol: string })[];
  finds: SpecFind[];
  rmax: number;
  elapsedMs: number;
};

export function storedResult(input: StoredResultInput): RunResult {
  const { engine, window, classes, finds } = input;
  if (engine.results.length !== input.tests.length)
    throw new Error(`The engine returned ${engine.results.length} results for ${input.tests.length} tests.`);
  const pts = new Map<string, Pts>(classes.map((c) => [c.id, { x: [], y: [] }]));
  for (const f of finds) {
    const p = pts.get(f.classId);
    if (p) {
      p.x.push(f.x);
      p.y.push(f.y);
    }
  }
  const of = (id: string): Pts => pts.get(id) ?? { x: [], y: [] };
  const inScope: ClassInScope[] = classes.map((c) => ({
    id: c.id,
    code: c.code,
    label: c.label,
    colour: c.colour,
    symbol: c.symbol,
    n: of(c.id).x.length,
  }));
  return {
    ...engine,
    rmax: input.rmax,
    correction: correctionOf(input.tests),
    outline: [window.outer, ...window.holes].map((r) => r.map((v) => [v[0], v[1]] as [number, number])),
    classes: inScope,
    density: classes.filter((c) => of(c.id).x.length >= 2).map((c) => kernelDensity(window, of(c.id), c.id)),
    finds: classes.map((c) => ({ classId: c.id, ...of(c.id) })),
    elapsedMs: input.elapsedMs,
  };
}

/** A stored run's tests in the engine's shape: runs stored in the former shape are read by former-run.ts. */
export function storedTests(row: Pick<AnalysisRun, "params" | "scope" | "result">): RunTest[] {
  const params = row.params as RunParamsStored;
  // A finished run ran its classes in the order its result lists them; otherwise in the scope's order.
  const classes = (row.result as Pick<RunResult, "classes"> | null)?.classes;
  const order = classes?.map((c) => c.id) ?? (row.scope as RunScope).classIds;
  return readRunTests(params.tests ?? [], order, params.correction);
}

/** A stored run's square-count tests in the engine's shape: those stored in the former shape read by former-run.ts. */
export function storedSquareTests(row: Pick<AnalysisRun, "params">): SquareTest[] {
  return readSquareTests((row.params as RunParamsStored).squareTests ?? []);
}

/** A stored run's result in today's shape, whatever shape it was stored in (null before it finished). */
export function readRunResult(row: Pick<AnalysisRun, "params" | "scope" | "result">): RunResult | null {
  const stored: unknown = row.result;
  if (stored === null || stored === undefined) return null;
  if (!isFormerResult(stored)) return stored as RunResult;
  return readFormerResult(stored, storedTests(row), storedSquareTests(row));
}

/** A stored run's parameters and result in today's shapes, as the API and the deposition package give them. */
export function readStoredRun(row: Pick<AnalysisRun, "params" | "scope" | "result">) {
  const params = row.params as RunParamsStored;
  return {
    params: { ...params, tests: storedTests(row), ...(params.squareTests && { squareTests: storedSquareTests(row) }) },
    result: readRunResult(row),
  };
}
