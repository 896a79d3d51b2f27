/**
 * Saved runs from before the app took the engine's test names: migration 0009 renames them in the stored
 * parameters, result and method list, so an old run opens with today's names and can be started again with
 * its stored request. Checked as a round trip: a fresh run is written back with the old names (as older
 * versions of Loamwork stored it), the migration's own SQL is applied, and the row must equal the fresh one.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { session, call } from "../support/harness";
import { seedDemoSite, type DemoSite } from "../support/demo-site";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { runsIdle } from "@/lib/server/jobs/run-queue";
import * as runsRoute from "@/app/api/sites/[siteId]/runs/route";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";

let d: DemoSite;
beforeAll(async () => {
  d = await seedDemoSite();
});

const OLD: [string, string][] = [
  ['"kind": "l-envelope"', '"kind": "l-csr"'],
  ['"kind": "pcf-envelope"', '"kind": "pcf"'],
  ['"kind": "k-difference"', '"kind": "k-diff"'],
  ['"kind": "inhomogeneous-l"', '"kind": "inhom-l"'],
  ['"null": "random-labelling"', '"null": "labelling"'],
  ['"null": "a-fixed"', '"null": "fixed-a"'],
];
const toOld = (json: unknown) =>
  OLD.reduce((t, [now, old]) => t.split(now).join(old), JSON.stringify(json).replace(/":/g, '": '));

describe("saved runs with the app's former test names", () => {
  it("are renamed by the migration and open and run again as before", async () => {
    session.userId = d.people.specialist;
    const request = {
      scope: { trenchId: d.trenchId, contextIds: [d.ctx[1005]], classIds: [d.cls.FLK, d.cls.CHP] },
      tests: [
        { kind: "l-envelope" },
        { kind: "pcf-envelope" },
        { kind: "cross-l", a: d.cls.FLK, b: d.cls.CHP, null: "a-fixed" },
        { kind: "k-difference", a: d.cls.FLK, b: d.cls.CHP },
        { kind: "inhomogeneous-l", classId: d.cls.FLK, reference: "all" },
      ],
      params: { nsim: 19, seed: 77 },
    };
    const res = await call(runsRoute, "POST", { siteId: d.siteId }, request);
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    const runId = res.json.id as string;
    await runsIdle();
    const db = await getDb();
    const [fresh] = await db.select().from(s.analysisRuns).where(eq(s.analysisRuns.id, runId));
    expect(fresh?.status).toBe("done");
    if (!fresh) throw new Error("run not stored");

    // Written back as an older Loamwork stored it.
    const oldMethod = fresh.method
      .replace("l-envelope", "l-csr")
      .replace("pcf-envelope", "pcf")
      .replace("k-difference", "k-diff")
      .replace("inhomogeneous-l", "inhom-l");
    await db.execute(
      sql`UPDATE analysis_runs SET params = ${toOld(fresh.params)}::jsonb, result = ${toOld(fresh.result)}::jsonb, method = ${oldMethod} WHERE id = ${runId}`,
    );
    const [stale] = await db.select().from(s.analysisRuns).where(eq(s.analysisRuns.id, runId));
    expect(JSON.stringify(stale?.params)).toContain('"kind":"l-csr"');
    expect(JSON.stringify(stale?.result)).toContain('"null":"fixed-a"');
    expect(stale?.method).toContain("inhom-l");

    const migration = readFileSync(path.join(process.cwd(), "drizzle", "0009_stored_run_test_names.sql"), "utf8");
    for (const statement of migration.split("--> statement-breakpoint")) await db.execute(sql.raw(statement));

    const [renamed] = await db.select().from(s.analysisRuns).where(eq(s.analysisRuns.id, runId));
    expect(renamed?.params).toEqual(fresh.params);
    expect(renamed?.result).toEqual(fresh.result);
    expect(renamed?.method).toBe(fresh.method);

    // It opens, and its stored request is accepted again as it stands.
    const view = (await call(runRoute, "GET", { siteId: d.siteId, runId })).json;
    expect(view.result.tests.map((t: { kind: string }) => t.kind)).toEqual(
      expect.arrayContaining(["l-envelope", "pcf-envelope", "cross-l", "k-difference", "inhomogeneous-l"]),
    );
    const again = await call(
      runsRoute,
      "POST",
      { siteId: d.siteId },
      { scope: view.scope, tests: view.params.tests, params: { nsim: 19, seed: view.seed } },
    );
    expect(again.status, JSON.stringify(again.json)).toBe(201);
    await runsIdle();
    const rerun = (await call(runRoute, "GET", { siteId: d.siteId, runId: again.json.id })).json;
    expect(rerun.result.tests).toEqual(view.result.tests);
  });
});
