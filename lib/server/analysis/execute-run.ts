import "server-only";
import { eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { analysisRuns } from "@/db/schema";
import {
  ENGINE_VERSION,
  SpatialInputError,
  runDistributionTest,
  type RunResult as EngineResult,
  type SimulationPool,
} from "@/lib/spatial";
import { buildEngineSpec } from "./engine-spec";
import { storedResult } from "./stored-result";
import type { RunScope } from "@/lib/schemas/run";
import type { RunParamsStored } from "@/lib/api/patterns-responses";
import { readRunTests, readSquareTests } from "@/lib/schemas/former-run";
import { markDone, markFailed, markRunning, writeProgress } from "./run-rows";
import { loadScope, type ScopeData } from "./scope-data";
import { runSquareTests, squareTestCount } from "./square-tests";

/**
 * Progress reaches the run's row at most this often (ms), and through the row's trigger every watcher
 * (run-events.ts): the one place progress is thinned. The engine reports every chunk of simulations, far
 * more often than a progress bar needs redrawing; ten writes a second is smooth and costs the database little.
 */
export const PROGRESS_EVERY_MS = 100;

export type ExecuteOptions = {
  signal: AbortSignal;
  pool: SimulationPool | null;
  /**
   * The records as the request that created the run read them, handed over when the run starts at once
   * in the same process; the run then computes on exactly what its fingerprint was taken of.
   */
  scope?: ScopeData;
};

/**
 * Executes one stored run: reads its records (this process holds the database; the worker threads get
 * plain arrays), runs the engine with progress and cancellation, stores the result or the reason it
 * failed. A run cancelled elsewhere is noticed at the next progress write and stopped.
 */
export async function executeRun(db: Db, runId: string, options: ExecuteOptions): Promise<void> {
  const [row] = await db.select().from(analysisRuns).where(eq(analysisRuns.id, runId));
  if (!row || (row.status !== "queued" && row.status !== "running")) return;
  const params = row.params as RunParamsStored;
  const started = Date.now();
  try {
    // The fingerprint is of the records actually read, which may have changed since the run was queued.
    const data = options.scope ?? (await loadScope(db, row.siteId, row.scope as RunScope));
    const startedAt = new Date();
    if (!(await markRunning(db, runId, data.fingerprint, startedAt))) return;
    const stop = new AbortController();
    const relay = () => stop.abort();
    options.signal.addEventListener("abort", relay, { once: true });
    if (options.signal.aborted) stop.abort();
    // At most one progress write in flight and one per PROGRESS_EVERY_MS; a write that finds the run no
    // longer running (cancelled from elsewhere) stops the engine.
    let lastWrite = 0;
    let writing: Promise<void> | null = null;
    const onProgress = (fraction: number) => {
      const now = Date.now();
      if (fraction >= 1 || stop.signal.aborted || writing || now - lastWrite < PROGRESS_EVERY_MS) return;
      lastWrite = now;
      writing = writeProgress(db, runId, fraction)
        .then(
          (stillRunning) => {
            if (!stillRunning) stop.abort();
          },
          (err) => console.error(`[loamwork] run ${runId}: progress not written`, err),
        )
        .finally(() => (writing = null));
    };
    const finds = data.finds.map((f) => ({ x: f.x, y: f.y, classId: f.classId }));
    // A run queued in the former shape runs its classes in the order the scope reads them, as it always did.
    const tests = readRunTests(
      params.tests ?? [],
      data.classes.map((c) => c.id),
      params.correction,
    );
    const spec = buildEngineSpec({ window: data.window, classes: data.classes, finds, tests, params, seed: row.seed });
    // One progress bar for the whole run: the point tests' share of it, then the square-count tests', in
    // proportion to how many tests each holds.
    const squareTests = readSquareTests(params.squareTests ?? []);
    const squareWork = squareTestCount(data, squareTests);
    const pointShare = squareWork ? spec.tests.length / (spec.tests.length + squareWork) : 1;
    try {
      const engineStart = Date.now();
      // A run of square-count tests alone has no point tests for the engine's simulation run.
      const engine: EngineResult = spec.tests.length
        ? await runDistributionTest(spec, {
            onProgress: (f) => onProgress(f * pointShare),
            signal: stop.signal,
            pool: options.pool,
            stored: true,
          })
        : {
            engineVersion: ENGINE_VERSION,
            seed: row.seed,
            nsim: params.nsim,
            level: params.level,
            window: { area: data.window.area, perimeter: data.window.perimeter, holes: data.window.holes.length },
            points: finds.length,
            results: [],
            cautions: [],
          };
      const squareResults = await runSquareTests(data, squareTests, params, row.seed, {
        signal: stop.signal,
        onProgress: (f) => onProgress(pointShare + f * (1 - pointShare)),
      });
      const engineEnd = Date.now();
      await writing;
      if (stop.signal.aborted) return;
      const result = storedResult({
        engine,
        tests,
        window: data.window,
        classes: data.classes,
        finds,
        rmax: params.rmax,
        elapsedMs: Date.now() - started,
      });
      if (squareResults.length) result.squareTests = squareResults;
      result.timing = { engineStart, engineEnd };
      await markDone(db, runId, result);
    } finally {
      options.signal.removeEventListener("abort", relay);
      await writing;
    }
  } catch (err) {
    if (isAbort(err)) return; // the status already says cancelled (or the process is stopping)
    const message =
      err instanceof SpatialInputError ? err.message : "The run failed on the server; see the server log.";
    if (!(err instanceof SpatialInputError)) console.error(`[loamwork] run ${runId} failed`, err);
    await markFailed(db, runId, message);
  }
}

function isAbort(err: unknown): boolean {
  return (err instanceof Error || err instanceof DOMException) && (err as Error).name === "AbortError";
}
