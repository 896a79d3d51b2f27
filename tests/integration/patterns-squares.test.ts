/**
 * Square-count tests in the Patterns run: started through the runs route like the point tests, run as a
 * job, stored with the run, and marked out of date when a count they read changes. The fixture trench is
 * 10 m × 6 m with a 2 m × 1 m baulk: 58 squares of 1 m, every one recorded, with a block of high counts.
 */
import { describe, expect, it } from "vitest";
import { and, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { gridTrench } from "./role-cases/squares";
import { seedDemoSite } from "../support/demo-site";
import { runsIdle } from "@/lib/server/jobs/run-queue";
import { squareTestViews } from "@/lib/patterns-view/square-view";
import * as runsRoute from "@/app/api/sites/[siteId]/runs/route";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";

/** Counts: 30 in the 2 × 2 block at E8–9 N3–4, else 1–4 by a fixed rule; the baulk's squares have none. */
async function recordEverySquare(fx: SiteFixture) {
  await gridTrench(fx);
  const db = await getDb();
  for (let row = 0; row < 6; row++) {
    for (let col = 0; col < 10; col++) {
      if (row === 2 && (col === 4 || col === 5)) continue; // under the baulk
      const [s] = await db
        .insert(schema.squareSamples)
        .values({ siteId: fx.site.id, trenchId: fx.trench.id, contextId: fx.context.id, col, row })
        .returning();
      const count = col >= 8 && row >= 3 && row <= 4 ? 30 : 1 + ((col * 5 + row * 3) % 4);
      await db.insert(schema.squareCounts).values({ sampleId: s!.id, classId: fx.cls.id, count });
    }
  }
}

async function start(fx: SiteFixture, body: Record<string, unknown>) {
  session.userId = fx.people.specialist.id;
  return call(
    runsRoute,
    "POST",
    { siteId: fx.site.id },
    {
      scope: { trenchId: fx.trench.id, contextIds: [fx.context.id], classIds: [fx.cls.id] },
      tests: [],
      params: { nsim: 199, seed: 11 },
      ...body,
    },
  );
}
const read = async (fx: SiteFixture, runId: string) =>
  (await call(runRoute, "GET", { siteId: fx.site.id, runId })).json;

describe("square-count tests in a run", () => {
  it("leave out a square whose record did not count the class, rather than take it as zero", async () => {
    const fx = await makeSite();
    await recordEverySquare(fx);
    const db = await getDb();
    const [burnt] = await db
      .insert(schema.artefactClasses)
      .values({
        siteId: fx.site.id,
        code: "BST",
        label: "Burnt stone",
        material: "stone",
        colour: "#7a3b12",
        symbol: "square",
      })
      .returning();
    // Burnt stone counted in the squares of the first four columns only; elsewhere the class was not counted.
    const samples = await db.select().from(schema.squareSamples).where(eq(schema.squareSamples.trenchId, fx.trench.id));
    const counted = samples.filter((s) => s.col < 4);
    for (const s of counted)
      await db.insert(schema.squareCounts).values({ sampleId: s.id, classId: burnt!.id, count: s.row % 3 });
    session.userId = fx.people.specialist.id;
    const res = await call(
      runsRoute,
      "POST",
      { siteId: fx.site.id },
      {
        scope: { trenchId: fx.trench.id, contextIds: [fx.context.id], classIds: [burnt!.id] },
        tests: [],
        squareTests: [{ kind: "moran" }],
        params: { nsim: 99, seed: 5 },
      },
    );
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    await runsIdle();
    const run = await read(fx, res.json.id);
    expect(run.status, run.error).toBe("done");
    expect(squareTestViews(run.result)[0].n).toBe(counted.length);
    expect(counted.length).toBeLessThan(samples.length);
  });

  it("run as a job: Moran's I finds the block clustered, Gi* marks it as hot spots, and the run is stored", async () => {
    const fx = await makeSite();
    await recordEverySquare(fx);
    // 999 permutations: with fewer, the smallest p of a square could not survive the adjustment over 58.
    const res = await start(fx, {
      squareTests: [{ type: "moran" }, { type: "getis-ord", style: "binary" }],
      params: { nsim: 999, seed: 11 },
    });
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    await runsIdle();
    const run = await read(fx, res.json.id);
    expect(run.status, run.error).toBe("done");
    expect(run.params.squareTests.map((t: { type: string }) => t.type)).toEqual(["moran", "getis-ord"]);
    const [moran, gi] = squareTestViews(run.result);
    expect(moran.kind).toBe("moran");
    expect(moran.n).toBe(58);
    expect(moran.verdict).toBe("clustered");
    expect(moran.p).toBeCloseTo(2 / 1000, 12); // two-sided, no permutation of 999 reaching the observed I
    expect(moran.sentence).toMatch(/999 permutations, seed 11/);
    expect(moran.cells).toHaveLength(58);
    expect(gi.verdict).toBe("hot-spots");
    const hot = gi.cells
      .filter((c: { class: string }) => c.class === "hot spot")
      .map((c: { label: string }) => c.label);
    // At least three of the block's four squares, and nothing away from it (squares named "E/N" of their corner).
    expect(hot.filter((l: string) => ["8/3", "9/3", "8/4", "9/4"].includes(l)).length).toBeGreaterThanOrEqual(3);
    expect(
      hot.every((l: string) => {
        const [e, n] = l.split("/").map(Number);
        return e >= 7 && n >= 2 && n <= 5;
      }),
    ).toBe(true);
    expect(gi.notes.join(" ")).toMatch(/a hot spot is a place, not a process/i);
    expect(gi.seed).toBe(12); // the run's seed + 1 for the second test
  });

  it("on the demo's sieved chips (context 1005): clustered round the knapping spots, hot spots there, spits uneven said", async () => {
    const d = await seedDemoSite();
    session.userId = d.people.specialist;
    const res = await call(
      runsRoute,
      "POST",
      { siteId: d.siteId },
      {
        scope: { trenchId: d.trenchId, contextIds: [d.ctx[1005]], classIds: [d.cls.CHP] },
        tests: [],
        squareTests: [{ kind: "moran" }, { kind: "getis-ord" }],
        params: { nsim: 999, seed: 3 },
      },
    );
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    await runsIdle();
    const run = (await call(runRoute, "GET", { siteId: d.siteId, runId: res.json.id })).json;
    expect(run.status, run.error).toBe("done");
    const [moran, gi] = squareTestViews(run.result);
    expect(moran.verdict).toBe("clustered");
    // The demo's chips crowd round spots at (2.2, 2.0) and (2.6, 6.2) (scripts/seed/seed-demo-squares.ts).
    const hot = gi.cells.filter((c: { class: string }) => c.class === "hot spot");
    expect(hot.length).toBeGreaterThan(0);
    for (const c of hot) {
      const [cx, cy] = [(c.x0 + c.x1) / 2, (c.y0 + c.y1) / 2];
      expect(Math.min(Math.hypot(cx - 2.2, cy - 2.0), Math.hypot(cx - 2.6, cy - 6.2)), c.label).toBeLessThan(3);
    }
    // Spit 2 is dug only in the northern squares so far: the run says so.
    expect(moran.notes[0]).toMatch(/different numbers of spits or contexts in this scope \(1 to 2\)/);
  });

  it("takes a square test asked in the former shape as the engine's spec, stored and run as asked in it", async () => {
    const fx = await makeSite();
    await recordEverySquare(fx);
    const former = await start(fx, {
      squareTests: [
        { kind: "local-moran", neighbours: "distance", band: 2, variable: "count", minArea: 0.2 },
        { kind: "geary", neighbours: "rook" },
      ],
    });
    expect(former.status, JSON.stringify(former.json)).toBe(201);
    const asked = [
      {
        type: "local-moran",
        neighbours: { type: "distance", lower: 0, upper: 2 },
        style: "row",
        variable: "count",
        minArea: 0.2,
        isolated: "drop",
        alternative: "two-sided",
      },
      {
        type: "geary",
        neighbours: { type: "rook", from: "shapes" },
        style: "row",
        variable: "density",
        minArea: 0,
        isolated: "drop",
        alternative: "two-sided",
      },
    ];
    const today = await start(fx, { squareTests: asked });
    expect(today.status, JSON.stringify(today.json)).toBe(201);
    await runsIdle();
    const [a, b] = [await read(fx, former.json.id), await read(fx, today.json.id)];
    expect(a.params.squareTests).toEqual(asked);
    expect(b.params.squareTests).toEqual(asked);
    expect(a.status, a.error).toBe("done");
    expect(squareTestViews(a.result)).toEqual(squareTestViews(b.result));
    expect(squareTestViews(a.result).map((t) => t.neighbours)).toEqual([
      "square centres up to 2 m apart",
      "rook contiguity (a shared edge), from the clipped squares",
    ]);
  });

  it("refuses a distance band whose lower limit is not below its upper one, naming the field", async () => {
    const fx = await makeSite();
    await recordEverySquare(fx);
    const res = await start(fx, {
      squareTests: [{ type: "moran", neighbours: { type: "distance", lower: 2, upper: 1.5 } }],
    });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.json)).toContain("The distance band's lower limit must be below its upper limit.");
  });

  it("marks the run out of date when a count it read changes", async () => {
    const fx = await makeSite();
    await recordEverySquare(fx);
    const res = await start(fx, { squareTests: [{ kind: "geary" }] });
    await runsIdle();
    expect((await read(fx, res.json.id)).outOfDate).toBe(false);
    const db = await getDb();
    const [sample] = await db
      .select()
      .from(schema.squareSamples)
      .where(
        and(
          eq(schema.squareSamples.trenchId, fx.trench.id),
          eq(schema.squareSamples.col, 0),
          eq(schema.squareSamples.row, 0),
        ),
      );
    await db.update(schema.squareCounts).set({ count: 9 }).where(eq(schema.squareCounts.sampleId, sample!.id));
    await db
      .update(schema.squareSamples)
      .set({ updatedAt: new Date(Date.now() + 1000) })
      .where(eq(schema.squareSamples.id, sample!.id));
    expect((await read(fx, res.json.id)).outOfDate).toBe(true);
  });

  it("marks the run out of date when the outline is redrawn: the squares are cut again, the counts kept", async () => {
    const fx = await makeSite();
    await recordEverySquare(fx);
    const res = await start(fx, { squareTests: [{ kind: "moran" }] });
    await runsIdle();
    expect((await read(fx, res.json.id)).outOfDate).toBe(false);
    session.userId = fx.people.director.id;
    const [t] = await (await getDb()).select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id));
    const ring = t!.outline.coordinates[0]!.map(([x, y]) => [x === 10 ? 9.5 : x, y]);
    const outline = { type: "Polygon", coordinates: [ring, ...t!.outline.coordinates.slice(1)] };
    const moved = await call(trenchRoute, "PATCH", { siteId: fx.site.id, trenchId: fx.trench.id }, { outline });
    expect(moved.status, JSON.stringify(moved.json)).toBe(200);
    expect((await read(fx, res.json.id)).outOfDate).toBe(true);
  });

  it("refuses a run with no test, and square tests with no grid, no counts or no square left to test, writing nothing", async () => {
    const fx = await makeSite();
    const none = await start(fx, {});
    expect(none.status).toBe(400);
    expect(JSON.stringify(none.json)).toContain("Choose at least one test.");
    const noGrid = await start(fx, { squareTests: [{ kind: "moran" }] });
    expect(noGrid.status).toBe(400);
    expect(noGrid.json.error).toMatch(/has no square grid/);
    await gridTrench(fx);
    const noCounts = await start(fx, { squareTests: [{ kind: "moran" }] });
    expect(noCounts.status).toBe(400);
    expect(noCounts.json.error).toMatch(/No counts by grid square are recorded in the chosen contexts/);
    // A grid that leaves no square: a minimum area above any square's, or every counted square now outside.
    await recordEverySquare(fx);
    const tooBig = await start(fx, { squareTests: [{ kind: "moran", minArea: 1.5 }] });
    expect(tooBig.status).toBe(400);
    expect(tooBig.json.error).toBe(
      "A minimum area of 1.5 m² leaves no square to test: the most any square in scope was dug is 1 m².",
    );
    const db0 = await getDb();
    // Every record moved off the trench, as a redrawn outline would leave them.
    await db0
      .update(schema.squareSamples)
      .set({ col: sql`${schema.squareSamples.col} + 40` })
      .where(eq(schema.squareSamples.trenchId, fx.trench.id));
    const outside = await start(fx, { squareTests: [{ kind: "moran" }] });
    expect(outside.status).toBe(400);
    expect(outside.json.error).toMatch(
      /^The grid leaves no square to test: every square counted in the chosen contexts lies outside trench/,
    );
    const bad = await start(fx, { squareTests: [{ kind: "moran", neighbours: "bishop" }] });
    expect(bad.status).toBe(400);
    const db = await getDb();
    expect(await db.select().from(schema.analysisRuns).where(eq(schema.analysisRuns.siteId, fx.site.id))).toHaveLength(
      0,
    );
  });
});
