import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { makeBenchmark } from "./role-cases/levels";
import * as datumRoute from "@/app/api/sites/[siteId]/datum/route";
import * as benchmarkRoute from "@/app/api/sites/[siteId]/benchmarks/[benchmarkId]/route";
import * as runsRoute from "@/app/api/sites/[siteId]/level-runs/route";
import * as runRoute from "@/app/api/sites/[siteId]/level-runs/[runId]/route";
import * as spitsRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/spits/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";

async function findOf(fx: SiteFixture) {
  session.userId = fx.people.digger.id;
  const res = await call(
    findsRoute,
    "POST",
    { siteId: fx.site.id },
    { contextId: fx.context.id, classId: fx.cls.id, x: 1.5, y: 1.5 },
  );
  expect(res.status).toBe(201);
  return res.json;
}

/** The hand-worked book of lib/levels/levelling.test.ts, taken on a find, the context's top and a spit. */
async function bookRun(fx: SiteFixture, closingLevel: number, targets: { findId: string; spitId: string }) {
  const start = await makeBenchmark(fx, 50);
  const close = await makeBenchmark(fx, closingLevel);
  session.userId = fx.people.digger.id;
  return call(
    runsRoute,
    "POST",
    { siteId: fx.site.id },
    {
      takenOn: "2026-06-12",
      trenchId: fx.trench.id,
      startBenchmarkId: start.id,
      closingBenchmarkId: close.id,
      lines: [
        { station: start.code, target: "benchmark", backsight: 1.525 },
        { station: "find", target: "find", targetId: targets.findId, intermediate: 1.87 },
        { station: "spit 1 top", target: "spit_top", targetId: targets.spitId, intermediate: 2.14 },
        { station: "CP1", target: "change_point", foresight: 2.615, backsight: 0.985 },
        { station: "top", target: "context_top", targetId: fx.context.id, intermediate: 1.005 },
        { station: close.code, target: "benchmark", foresight: 1.76 },
      ],
    },
  );
}

describe("levels: datum, benchmarks, levelling runs, spits", () => {
  it("a find recorded without a level has none (null), never 0", async () => {
    const fx = await makeSite();
    const find = await findOf(fx);
    expect(find.z).toBeNull();
  });

  it("books a run: reduced levels reach the find and the spit, every line is kept as a spot level", async () => {
    const fx = await makeSite();
    const find = await findOf(fx);
    const spit = await call(spitsRoute, "POST", { siteId: fx.site.id, contextId: fx.context.id }, { number: 1 });
    expect(spit.status).toBe(201);
    const res = await bookRun(fx, 48.13, { findId: find.id, spitId: spit.json.id });
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    expect(res.json.misclosure).toBe(0.005);
    expect(res.json.withinTolerance).toBe(true); // the site's default tolerance, 5 mm
    const db = await getDb();
    const [f] = await db.select().from(schema.finds).where(eq(schema.finds.id, find.id));
    expect(f!.z).toBe(49.655);
    const [s] = await db.select().from(schema.spits).where(eq(schema.spits.id, spit.json.id));
    expect(s!.topLevel).toBe(49.385);
    const read = await call(runRoute, "GET", { siteId: fx.site.id, runId: res.json.id });
    expect(read.json.levels.map((l: { level: number }) => l.level)).toEqual([50, 49.655, 49.385, 48.91, 48.89, 48.135]);
    expect(read.json.levels.every((l: { flagged: boolean }) => !l.flagged)).toBe(true);
  });

  it("flags, never hides, the levels of a run that closes outside the director's tolerance", async () => {
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    expect((await call(datumRoute, "PATCH", { siteId: fx.site.id }, { levelTolerance: 0.003 })).status).toBe(200);
    const find = await findOf(fx);
    const spit = await call(spitsRoute, "POST", { siteId: fx.site.id, contextId: fx.context.id }, { number: 1 });
    const res = await bookRun(fx, 48.13, { findId: find.id, spitId: spit.json.id });
    expect(res.status).toBe(201);
    expect(res.json.withinTolerance).toBe(false);
    const read = await call(runRoute, "GET", { siteId: fx.site.id, runId: res.json.id });
    expect(read.json.levels).toHaveLength(6);
    expect(read.json.levels.every((l: { flagged: boolean }) => l.flagged)).toBe(true);
  });

  it("refuses a book it cannot reduce, naming the line, and writes nothing", async () => {
    const fx = await makeSite();
    const start = await makeBenchmark(fx, 50);
    session.userId = fx.people.digger.id;
    const db = await getDb();
    const runsBefore = (await db.select().from(schema.levelRuns)).length;
    const res = await call(
      runsRoute,
      "POST",
      { siteId: fx.site.id },
      {
        takenOn: "2026-06-12",
        startBenchmarkId: start.id,
        lines: [
          { station: start.code, target: "benchmark", backsight: 1.2 },
          { station: "top", target: "context_top", targetId: fx.context.id, intermediate: 1.1, foresight: 1.0 },
        ],
      },
    );
    expect(res.status).toBe(400);
    expect(res.json.error).toMatch(/Line 2 of the level book/);
    expect(Object.keys(res.json.fieldErrors)).toEqual(["lines.1.station"]);
    expect((await db.select().from(schema.levelRuns)).length).toBe(runsBefore);
    const noTarget = await call(
      runsRoute,
      "POST",
      { siteId: fx.site.id },
      {
        takenOn: "2026-06-12",
        startBenchmarkId: start.id,
        lines: [
          { station: start.code, target: "benchmark", backsight: 1.2 },
          { station: "a find", target: "find", foresight: 1.0 },
        ],
      },
    );
    expect(noTarget.status).toBe(400);
    expect(noTarget.json.fieldErrors).toHaveProperty(["lines.1.targetId"]);
  });

  it("keeps a benchmark's level once a run was reduced from it", async () => {
    const fx = await makeSite();
    const find = await findOf(fx);
    const spit = await call(spitsRoute, "POST", { siteId: fx.site.id, contextId: fx.context.id }, { number: 1 });
    const res = await bookRun(fx, 48.13, { findId: find.id, spitId: spit.json.id });
    session.userId = fx.people.director.id;
    const change = await call(
      benchmarkRoute,
      "PATCH",
      { siteId: fx.site.id, benchmarkId: res.json.startBenchmarkId },
      { level: 50.1 },
    );
    expect(change.status).toBe(409);
    expect(change.json.error).toMatch(/levelling runs were reduced from it/);
    const del = await call(benchmarkRoute, "DELETE", { siteId: fx.site.id, benchmarkId: res.json.startBenchmarkId });
    expect(del.status).toBe(409);
  });

  it("refuses a spit whose top lies below its base, and unknown fields", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const bad = await call(
      spitsRoute,
      "POST",
      { siteId: fx.site.id, contextId: fx.context.id },
      { number: 1, topLevel: 49.2, baseLevel: 49.3 },
    );
    expect(bad.status).toBe(400);
    expect(bad.json.fieldErrors).toHaveProperty("baseLevel");
    const unknown = await call(
      spitsRoute,
      "POST",
      { siteId: fx.site.id, contextId: fx.context.id },
      { number: 1, depth: 0.1 },
    );
    expect(unknown.status).toBe(400);
  });
});

describe("context sheets: dimensions, dates and method", () => {
  it("keeps blank measures as not recorded (null), refuses closing before opening and a mesh on a trowelled context", async () => {
    const contextRoute = await import("@/app/api/sites/[siteId]/contexts/[contextId]/route");
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const params = { siteId: fx.site.id, contextId: fx.context.id };
    const ok = await call(contextRoute, "PATCH", params, {
      lengthM: "2.40",
      widthM: "",
      thicknessM: 0.12,
      openedOn: "2026-06-01",
      digMethod: "sieved",
      sieveMeshMm: "4",
      excavatedBy: "N. Ashgrove",
    });
    expect(ok.status, JSON.stringify(ok.json)).toBe(200);
    expect(ok.json).toMatchObject({
      lengthM: 2.4,
      widthM: null,
      thicknessM: 0.12,
      openedOn: "2026-06-01",
      digMethod: "sieved",
      sieveMeshMm: 4,
      excavatedBy: "N. Ashgrove",
    });
    const early = await call(contextRoute, "PATCH", params, { closedOn: "2026-05-30" });
    expect(early.status).toBe(400);
    expect(early.json.fieldErrors).toHaveProperty("closedOn");
    const mesh = await call(contextRoute, "PATCH", params, { digMethod: "trowel" });
    expect(mesh.status).toBe(400);
    expect(mesh.json.fieldErrors).toHaveProperty("sieveMeshMm");
    const db = await getDb();
    const [row] = await db.select().from(schema.contexts).where(eq(schema.contexts.id, fx.context.id));
    expect(row).toMatchObject({ closedOn: null, digMethod: "sieved" });
  });
});

describe("deep-trench caution from reduced levels", () => {
  it("measures a trench's depth as its surface level minus the lowest level recorded in it; no surface, no depth", async () => {
    const { trenchDepth } = await import("@/lib/server/trench-depth");
    const fx = await makeSite();
    const db = await getDb();
    expect((await trenchDepth(db, fx.site.id, fx.trench.id)).depth).toBeNull();
    const find = await findOf(fx);
    const spit = await call(spitsRoute, "POST", { siteId: fx.site.id, contextId: fx.context.id }, { number: 1 });
    await bookRun(fx, 48.13, { findId: find.id, spitId: spit.json.id });
    // Levels in the trench: find 49.655, spit top 49.385, context top 48.890 — but no ground level yet.
    expect((await trenchDepth(db, fx.site.id, fx.trench.id)).depth).toBeNull();
    await db.update(schema.trenches).set({ surfaceLevel: 50.4 }).where(eq(schema.trenches.id, fx.trench.id));
    expect(await trenchDepth(db, fx.site.id, fx.trench.id)).toEqual({
      surfaceLevel: 50.4,
      lowestLevel: 48.89,
      depth: 1.51,
    });
  });

  it("the demo site's trench B is deeper than 1.2 m from its levels, trench A is not", async () => {
    const { seedDemo } = await import("@/scripts/seed/seed-demo");
    const { trenchDepths } = await import("@/lib/server/trench-depth");
    const db = await getDb();
    const { siteId } = await seedDemo(db);
    const trenches = await db.select().from(schema.trenches).where(eq(schema.trenches.siteId, siteId));
    const depths = await trenchDepths(db, siteId);
    const byCode = Object.fromEntries(trenches.map((t) => [t.code, depths.get(t.id)?.depth]));
    expect(byCode.B).toBe(1.45);
    expect(byCode.A).toBeLessThan(1.2);
  });
});
