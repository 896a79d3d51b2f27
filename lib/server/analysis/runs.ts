import "server-only";
import { randomInt } from "node:crypto";
import { and, desc, eq, inArray } from "drizzle-orm";
import type { Db } from "@/db/client";
import { analysisRuns, type AnalysisRun } from "@/db/schema";
import { ENGINE_VERSION } from "@/lib/spatial";
import { recordAudit } from "../audit";
import { badInput, conflict, notFound } from "../errors";
import type { SiteActor } from "../membership";
import { runQueue } from "../jobs/run-queue";
import { defaultRmax, roundMetres } from "./defaults";
import type { RunCreate, RunScope, RunTest, TestKind } from "@/lib/schemas/run";
import { isFormerTest, readRunTests, readSquareTests } from "@/lib/schemas/former-run";
import { readStoredRun } from "./stored-result";
import type { RunParamsStored, RunView } from "@/lib/api/patterns-responses";
import { countsByClass, depthSummary, stratWarningsFor } from "./scope-summary";
import { currentFingerprint, loadScope, type ScopeData } from "./scope-data";
import { squareRefusals } from "./square-tests";
import { MIN_POINTS, tooFewMessage } from "./thresholds";
import { written } from "../written";

/** Every refusal of a test in this scope: a class it names is missing or has too few finds. */
export function testRefusals(data: ScopeData, tests: RunTest[]): string[] {
  const n = countsByClass(data);
  const code = new Map(data.classes.map((c) => [c.id, c.code]));
  const out: string[] = [];
  const need = (kind: TestKind, classId: string | undefined) => {
    const c = classId === undefined ? undefined : code.get(classId);
    if (c === undefined || classId === undefined) out.push(`A test names a class that is not in the chosen scope.`);
    else if ((n.get(classId) ?? 0) < MIN_POINTS[kind]) out.push(tooFewMessage(kind, c, n.get(classId) ?? 0));
  };
  for (const t of tests) {
    if (t.type === "cross-l" || t.type === "k-difference") {
      if (t.a === t.b) out.push("A test between two classes needs two different classes.");
      need(t.type, t.a);
      need(t.type, t.b);
    } else {
      need(t.type, t.class);
      if (t.type === "inhomogeneous-l" && t.reference !== undefined && !code.has(t.reference))
        out.push("The reference class of the inhomogeneous test is not in the chosen scope.");
    }
  }
  return [...new Set(out)];
}

export async function createRun(db: Db, actor: SiteActor, input: RunCreate): Promise<RunView> {
  // Got first, so that a queue starting now hands back older left-behind runs before this one.
  const queue = await runQueue();
  const data = await loadScope(db, actor.site.id, input.scope);
  if (input.params.correction !== undefined && !input.tests.some(isFormerTest))
    throw badInput("Each test carries its own edge correction.", {
      "params.correction": ["Set the correction on each test instead."],
    });
  // Tests asked for in the former shape run on every class in scope, in the order the scope reads them.
  const tests = readRunTests(
    input.tests,
    data.classes.map((c) => c.id),
    input.params.correction,
  );
  // Square-count tests asked for in the former shape are read into the engine's spec.
  const squareTests = readSquareTests(input.squareTests);
  const refusals = [...testRefusals(data, tests), ...squareRefusals(data, squareTests)];
  if (refusals.length) throw badInput(refusals.join(" "), { tests: refusals });
  const rmax = input.params.rmax ?? roundMetres(defaultRmax(data.window));
  if (rmax >= data.window.diameter) {
    throw badInput(
      `The distance range must stay below the trench's largest extent (${data.window.diameter.toFixed(2)} m).`,
      { "params.rmax": ["Too large for this trench."] },
    );
  }
  const params: RunParamsStored = {
    rmax,
    nsim: input.params.nsim,
    level: input.params.level,
    tests,
    ...(squareTests.length ? { squareTests } : {}),
    label: input.label,
    names: {
      trench: data.trench.code,
      contexts: data.contexts.map((c) => c.number),
      classes: data.classes.map((c) => c.code),
    },
    warnings: await stratWarningsFor(db, actor.site.id, data),
  };
  const depth = depthSummary(data);
  if (depth) params.depth = depth;
  const seed = input.params.seed ?? randomInt(0, 2 ** 31 - 1);
  const row = await db.transaction(async (tx) => {
    const run = written(
      await tx
        .insert(analysisRuns)
        .values({
          siteId: actor.site.id,
          trenchId: data.trench.id,
          scope: input.scope,
          method: [...new Set([...tests.map((t) => t.type), ...squareTests.map((t) => t.type)])].join(","),
          params,
          seed,
          engineVersion: ENGINE_VERSION,
          fingerprint: data.fingerprint,
          createdBy: actor.userId,
        })
        .returning(),
      "The new run",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "run",
      recordId: run.id,
      after: { scope: run.scope, params, seed },
    });
    return run;
  });
  await queue.submit(row.id, data);
  return toView(row, false);
}

function toView(row: AnalysisRun, outOfDate: boolean): RunView {
  return {
    id: row.id,
    status: row.status,
    progress: row.progress,
    error: row.error,
    seed: row.seed,
    engineVersion: row.engineVersion,
    fingerprint: row.fingerprint,
    outOfDate,
    scope: row.scope as RunScope,
    ...readStoredRun(row),
    createdAt: row.createdAt.toISOString(),
    startedAt: row.startedAt?.toISOString() ?? null,
    finishedAt: row.finishedAt?.toISOString() ?? null,
    now: new Date().toISOString(),
  };
}

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function getRow(db: Db, siteId: string, runId: string): Promise<AnalysisRun> {
  if (!uuidPattern.test(runId)) throw notFound("That run");
  const [row] = await db
    .select()
    .from(analysisRuns)
    .where(and(eq(analysisRuns.siteId, siteId), eq(analysisRuns.id, runId)));
  if (!row) throw notFound("That run");
  return row;
}

/** One run; out of date when the records it read have changed since (compared on every read). */
export async function readRun(db: Db, siteId: string, runId: string): Promise<RunView> {
  const row = await getRow(db, siteId, runId);
  // Only a finished run can be out of date; while it runs it is watched closely, so skip the re-read.
  if (row.status !== "done") return toView(row, false);
  const now = await currentFingerprint(db, siteId, row.scope as RunScope);
  return toView(row, now !== row.fingerprint);
}

/** Saved runs, newest first, without their (large) results; scopes are fingerprinted once each. */
export async function listRuns(db: Db, siteId: string, trenchId?: string): Promise<Omit<RunView, "result">[]> {
  const where = trenchId
    ? and(eq(analysisRuns.siteId, siteId), eq(analysisRuns.trenchId, trenchId))
    : eq(analysisRuns.siteId, siteId);
  const rows = await db.select().from(analysisRuns).where(where).orderBy(desc(analysisRuns.createdAt)).limit(200);
  const byScope = new Map<string, Promise<string | null>>();
  const out = [];
  for (const row of rows) {
    const key = JSON.stringify(row.scope);
    if (!byScope.has(key)) byScope.set(key, currentFingerprint(db, siteId, row.scope as RunScope));
    const { result: _omit, ...view } = toView(row, (await byScope.get(key)) !== row.fingerprint);
    out.push(view);
  }
  return out;
}

export async function cancelRun(db: Db, actor: SiteActor, runId: string): Promise<RunView> {
  const row = await getRow(db, actor.site.id, runId);
  if (row.status !== "queued" && row.status !== "running")
    throw conflict(`This run is already ${row.status}; only a queued or running run can be cancelled.`);
  const after = await db.transaction(async (tx) => {
    const [cancelled] = await tx
      .update(analysisRuns)
      .set({ status: "cancelled", finishedAt: new Date() })
      .where(and(eq(analysisRuns.id, runId), inArray(analysisRuns.status, ["queued", "running"])))
      .returning();
    if (!cancelled) throw conflict("This run finished just now; there is nothing left to cancel.");
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "cancel",
      recordType: "run",
      recordId: runId,
      before: { status: row.status, progress: row.progress },
      after: { status: "cancelled" },
    });
    return cancelled;
  });
  await (await runQueue()).cancel(runId);
  return toView(after, false);
}
