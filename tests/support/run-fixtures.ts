import { readFileSync } from "node:fs";
import path from "node:path";
import { expect } from "vitest";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { runsIdle } from "@/lib/server/jobs/run-queue";
import * as runsRoute from "@/app/api/sites/[siteId]/runs/route";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";
import type { DemoSite } from "./demo-site";
import { call } from "./harness";

/** A run as the JSON API gives it, read as the tests read it. */
type RunViewJson = Awaited<ReturnType<typeof call>>["json"];

/** A run as a former version of Loamwork stored it in analysis_runs, kept in tests/fixtures. */
export type StoredRunFixture<Result = Record<string, unknown>> = {
  scope: Record<string, unknown>;
  method: string;
  params: Record<string, unknown>;
  seed: number;
  engineVersion: string;
  result: Result;
};

/**
 * The runs of a fixture file in tests/fixtures, its {{trench}}, {{class CODE}} and {{context N}}
 * placeholders replaced by the demo site's record ids; a placeholder the site has no record for throws.
 */
export function readRunFixture<Result>(file: string, d: DemoSite): StoredRunFixture<Result>[] {
  const ids: Record<string, string> = { trench: d.trenchId };
  for (const [code, id] of Object.entries(d.cls)) ids[`class ${code}`] = id;
  for (const [n, id] of Object.entries(d.ctx)) ids[`context ${n}`] = id;
  const text = readFileSync(path.join(process.cwd(), "tests/fixtures", file), "utf8").replace(
    /\{\{([^}]+)\}\}/g,
    (_, name: string) => {
      const id = ids[name];
      if (!id) throw new Error(`No demo record for ${name}`);
      return id;
    },
  );
  return (JSON.parse(text) as { runs: StoredRunFixture<Result>[] }).runs;
}

/**
 * Puts a fixture's run into analysis_runs as the former code left it (done, by the specialist); gives its id.
 * `result` stores another result in its place (a test's variant of the fixture's), `fingerprint` marks the row.
 */
export async function storeRunFixture(
  d: DemoSite,
  run: StoredRunFixture<object>,
  opts: { result?: object; fingerprint?: string } = {},
): Promise<string> {
  const db = await getDb();
  const [row] = await db
    .insert(s.analysisRuns)
    .values({
      siteId: d.siteId,
      trenchId: d.trenchId,
      scope: run.scope,
      method: run.method,
      params: run.params,
      seed: run.seed,
      engineVersion: run.engineVersion,
      fingerprint: opts.fingerprint ?? "stored",
      status: "done",
      progress: 1,
      result: (opts.result ?? run.result) as Record<string, unknown>,
      createdBy: d.people.specialist,
      finishedAt: new Date(),
    })
    .returning();
  if (!row) throw new Error("run not stored");
  return row.id;
}

/**
 * Starts a stored run again as the API opened it (its scope, tests, square tests, simulations, level, r max
 * and seed), waits for the queue, and gives the new run as the API reads it; fails the test if it is refused
 * or does not finish.
 */
export async function startAgainAsOpened(siteId: string, view: RunViewJson): Promise<RunViewJson> {
  const again = await call(
    runsRoute,
    "POST",
    { siteId },
    {
      scope: view.scope,
      tests: view.params.tests,
      ...(view.params.squareTests && { squareTests: view.params.squareTests }),
      params: { nsim: view.params.nsim, level: view.params.level, rmax: view.params.rmax, seed: view.seed },
    },
  );
  expect(again.status, JSON.stringify(again.json)).toBe(201);
  await runsIdle();
  const rerun = (await call(runRoute, "GET", { siteId, runId: again.json.id })).json;
  expect(rerun.status, rerun.error).toBe("done");
  return rerun;
}
