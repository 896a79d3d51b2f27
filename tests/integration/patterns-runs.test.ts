/**
 * Runs as stored jobs on the demo site: the same seed on unchanged records gives the same numbers, a
 * changed record marks older runs out of date, cancel stops a run, progress ends at 1, a class with too
 * few finds is refused with the number it needs, contexts that are not one surface are warned about, and a
 * run left 'running' by a stopped process is run again. Fewer simulations than the default keep it short.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { seedDemoSite, type DemoSite } from "../support/demo-site";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { executeRun } from "@/lib/server/analysis/execute-run";
import { requeueOrphans } from "@/lib/server/analysis/run-rows";
import { runsIdle } from "@/lib/server/jobs/run-queue";
import * as runsRoute from "@/app/api/sites/[siteId]/runs/route";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";
import * as cancelRoute from "@/app/api/sites/[siteId]/runs/[runId]/cancel/route";
import * as scopeRoute from "@/app/api/sites/[siteId]/runs/scope/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";

let d: DemoSite;

beforeAll(async () => {
  d = await seedDemoSite();
});

const body = (over: Record<string, unknown> = {}) => ({
  scope: { trenchId: d.trenchId, contextIds: [d.ctx[1005]], classIds: [d.cls.SHD] },
  tests: [{ kind: "l-envelope" }, { kind: "clark-evans", correction: "monte-carlo" }],
  params: { nsim: 99, seed: 424242 },
  ...over,
});

async function start(b: unknown) {
  session.userId = d.people.specialist;
  const res = await call(runsRoute, "POST", { siteId: d.siteId }, b);
  expect(res.status, JSON.stringify(res.json)).toBe(201);
  return res.json.id as string;
}
const read = async (runId: string) => (await call(runRoute, "GET", { siteId: d.siteId, runId })).json;

describe("runs", () => {
  it("gives the same numbers for the same seed on unchanged records, and marks older runs out of date after a change", async () => {
    const first = await start(body());
    const second = await start(body());
    await runsIdle();
    const [a, b] = [await read(first), await read(second)];
    expect(a.status).toBe("done");
    expect(a.progress).toBe(1);
    expect(a.fingerprint).toBe(b.fingerprint);
    expect(b.result.results).toEqual(a.result.results);
    expect(a.outOfDate).toBe(false);

    // A digger moves one SHD find of 1005 by 10 cm, through the ordinary route.
    const db = await getDb();
    const [find] = await db
      .select()
      .from(s.finds)
      .where(and(eq(s.finds.contextId, d.ctx[1005]), eq(s.finds.classId, d.cls.SHD)))
      .limit(1);
    session.userId = d.people.digger;
    const moved = await call(findRoute, "PATCH", { siteId: d.siteId, findId: find.id }, { x: find.x + 0.1 });
    expect(moved.status, JSON.stringify(moved.json)).toBe(200);
    expect((await read(first)).outOfDate).toBe(true);
    const listed = (await call(runsRoute, "GET", { siteId: d.siteId })).json as { id: string; outOfDate: boolean }[];
    expect(listed.find((r) => r.id === second)!.outOfDate).toBe(true);

    // A new run on the changed records is up to date and reads a different fingerprint.
    const third = await start(body());
    await runsIdle();
    const c = await read(third);
    expect(c.outOfDate).toBe(false);
    expect(c.fingerprint).not.toBe(a.fingerprint);
  });

  it("cancels a running run: it stops before the end and keeps no result", async () => {
    // Four classes, L and Clark–Evans, 9999 simulations each: long enough to be caught running.
    const classIds = [d.cls.FLK, d.cls.SHD, d.cls.FCR, d.cls.CHP];
    const id = await start(
      body({
        scope: { trenchId: d.trenchId, contextIds: [d.ctx[1005]], classIds },
        tests: [{ kind: "l-envelope" }, { kind: "clark-evans", correction: "monte-carlo" }],
        params: { nsim: 9999, seed: 5 },
      }),
    );
    for (;;) {
      const run = await read(id); // as a page reading it would see it, live progress included
      if (run.status === "running" && run.progress > 0) break;
      expect(["queued", "running"]).toContain(run.status);
      await new Promise((r) => setTimeout(r, 20));
    }
    const res = await call(cancelRoute, "POST", { siteId: d.siteId, runId: id });
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    await runsIdle();
    const after = await read(id);
    expect(after.status).toBe("cancelled");
    expect(after.result).toBeNull();
    expect(after.progress).toBeLessThan(1);
    const again = await call(cancelRoute, "POST", { siteId: d.siteId, runId: id });
    expect(again.status).toBe(409);
  });

  it("refuses a test for a class with too few finds, saying how many it needs", async () => {
    session.userId = d.people.specialist;
    const res = await call(
      runsRoute,
      "POST",
      { siteId: d.siteId },
      body({ scope: { trenchId: d.trenchId, contextIds: [d.ctx[1005]], classIds: [d.cls.SHD, d.cls.BBN] } }),
    );
    expect(res.status).toBe(400);
    expect(res.json.error).toContain("needs at least 10 finds of BBN");
    expect(res.json.error).toContain("there are 0");
  });

  it("shows n per class and warns when the chosen contexts are not one surface", async () => {
    session.userId = d.people.digger;
    const one = await call(scopeRoute, "GET", { siteId: d.siteId }, undefined, {
      trenchId: d.trenchId,
      contextIds: d.ctx[1005],
      classIds: [d.cls.FLK, d.cls.BBN].join(","),
    });
    expect(one.status, JSON.stringify(one.json)).toBe(200);
    expect(one.json.warnings).toEqual([]);
    const flk = one.json.classes.find((c: { code: string }) => c.code === "FLK");
    expect(flk.n).toBe(150);
    expect(one.json.classes.find((c: { code: string }) => c.code === "BBN").tooFewFor).toContain("l-envelope");
    // The demo matrix: 1004 fills 1003, 1003 cuts 1005 — so 1004 is later than 1005.
    const two = await call(scopeRoute, "GET", { siteId: d.siteId }, undefined, {
      trenchId: d.trenchId,
      contextIds: [d.ctx[1004], d.ctx[1005]].join(","),
      classIds: d.cls.FLK,
    });
    expect(two.json.warnings).toHaveLength(1);
    expect(two.json.warnings[0]).toMatchObject({ kind: "ordered", a: 1004, b: 1005 });
    // a quarter of trench A's short side (bounding box), the workspace default for r max
    expect(two.json.defaults.rmax).toBeCloseTo(two.json.trench.shortSide / 4, 2);
  });

  it("lets a digger read runs but not start or cancel them", async () => {
    session.userId = d.people.digger;
    expect((await call(runsRoute, "GET", { siteId: d.siteId })).status).toBe(200);
    expect((await call(runsRoute, "POST", { siteId: d.siteId }, body())).status).toBe(403);
  });

  it("runs again a run that a stopped process left 'running'", async () => {
    const db = await getDb();
    const id = await start(body());
    await runsIdle();
    await db
      .update(s.analysisRuns)
      .set({ status: "running", progress: 0.4, result: null })
      .where(eq(s.analysisRuns.id, id));
    expect(await requeueOrphans(db)).toContain(id);
    expect((await read(id)).status).toBe("queued");
    await executeRun(db, id, { signal: new AbortController().signal, pool: null });
    const done = await read(id);
    expect(done.status).toBe("done");
    expect(done.progress).toBe(1);
  });
});
