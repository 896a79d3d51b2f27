/**
 * Analyses by depth: the Patterns scope limited to a range of reduced levels and/or to chosen spits. The
 * fixture context is dug in three 10 cm spits; its finds lie at three levels, a quarter with no level.
 * Expected finds are picked from the fixture list by plain filters, independent of the server's query.
 */
import { describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { runsIdle } from "@/lib/server/jobs/run-queue";
import * as runsRoute from "@/app/api/sites/[siteId]/runs/route";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";
import * as scopeRoute from "@/app/api/sites/[siteId]/runs/scope/route";
import * as siteRoute from "@/app/api/sites/[siteId]/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";

type Planned = { number: number; cls: "FL" | "PT"; z: number | null; spit: 1 | 2 | 3 | null };

async function depthSite() {
  const fx = await makeSite();
  const db = await getDb();
  const [pt] = await db
    .insert(schema.artefactClasses)
    .values({ siteId: fx.site.id, code: "PT", label: "Pottery", colour: "#d55e00", symbol: "circle" })
    .returning();
  const spitRows = await db
    .insert(schema.spits)
    .values(
      [1, 2, 3].map((n) => ({
        siteId: fx.site.id,
        contextId: fx.context.id,
        number: n,
        topLevel: 41.4 - (n - 1) * 0.1,
        baseLevel: 41.3 - (n - 1) * 0.1,
      })),
    )
    .returning();
  const spitId = new Map(spitRows.map((s) => [s.number, s.id]));
  // Flint: 24 finds at 41.15, 41.25 and 41.35 in turn, every fourth with no level (half of those in spit 2,
  // half in no spit). Pottery: 6 finds from 40.9 to 41.5, one exactly at 41.30 (a range's bound) and one with none.
  const planned: Planned[] = [];
  for (let i = 0; i < 24; i++) {
    const z = i % 4 === 3 ? null : [41.15, 41.25, 41.35][i % 3]!;
    const spit = z === null ? (i % 8 === 3 ? 2 : null) : z > 41.3 ? 1 : z > 41.2 ? 2 : 3;
    planned.push({ number: i + 1, cls: "FL", z, spit });
  }
  [40.9, 41.3, 41.5, null, 41.1, 41.22].forEach((z, i) =>
    planned.push({ number: 101 + i, cls: "PT", z, spit: z === null ? null : z > 41.3 ? 1 : z > 41.2 ? 2 : 3 }),
  );
  const rows = await db
    .insert(schema.finds)
    .values(
      planned.map((p, i) => ({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        contextId: fx.context.id,
        classId: p.cls === "FL" ? fx.cls.id : pt!.id,
        spitId: p.spit === null ? null : spitId.get(p.spit)!,
        number: p.number,
        // Away from the baulk (x 4–6, y 2–3): rows at y 0.5, 3.5 and 5.5.
        x: 0.5 + (i % 8) * 1.1,
        y: [0.5, 3.5, 5.5][Math.floor(i / 8) % 3]!,
        z: p.z,
        method: "typed" as const,
      })),
    )
    .returning();
  return { fx, pt: pt!, spitId, planned, rows };
}

const numbersOf = (ps: Planned[]) => ps.map((p) => p.number).sort((a, b) => a - b);

function scopeQuery(fx: SiteFixture, classIds: string[], extra: Record<string, string> = {}) {
  return { trenchId: fx.trench.id, contextIds: fx.context.id, classIds: classIds.join(","), ...extra };
}

/** A Clark–Evans run of the fixture's flint in its context, its scope narrowed by `depth`, by the session's user. */
function postRun(
  fx: SiteFixture,
  depth: Record<string, unknown>,
  { seed = 1, correction }: { seed?: number; correction?: "none" } = {},
) {
  return call(
    runsRoute,
    "POST",
    { siteId: fx.site.id },
    {
      scope: { trenchId: fx.trench.id, contextIds: [fx.context.id], classIds: [fx.cls.id], ...depth },
      tests: [correction ? { kind: "clark-evans", correction } : { kind: "clark-evans" }],
      params: { nsim: 19, seed },
    },
  );
}

async function runsOnSite(siteId: string) {
  const db = await getDb();
  const [row] = await db.select({ n: count() }).from(schema.analysisRuns).where(eq(schema.analysisRuns.siteId, siteId));
  return row!.n;
}

describe("Patterns scope by depth", () => {
  it("a level range keeps exactly the finds with a level inside it, bounds included, and names those with none", async () => {
    const { fx, pt, planned } = await depthSite();
    session.userId = fx.people.specialist.id;
    const inRange = planned.filter((p) => p.z !== null && p.z >= 41.2 && p.z <= 41.3);
    const res = await call(
      scopeRoute,
      "GET",
      { siteId: fx.site.id },
      undefined,
      scopeQuery(fx, [fx.cls.id, pt.id], { levelFrom: "41.20", levelTo: "41.30" }),
    );
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    const n = Object.fromEntries(res.json.classes.map((c: { code: string; n: number }) => [c.code, c.n]));
    expect(n).toEqual({
      FL: inRange.filter((p) => p.cls === "FL").length,
      PT: inRange.filter((p) => p.cls === "PT").length,
    });
    expect(n.PT).toBe(2); // 41.30 (the upper bound itself) and 41.22
    expect(res.json.totalFinds).toBe(inRange.length);
    expect(res.json.depth.noLevel.numbers).toEqual(numbersOf(planned.filter((p) => p.z === null)));
    expect(res.json.depth.noLevel.count).toBe(7);

    // The run reads the same finds, stores the range with its scope and the finds it left out.
    const created = await postRun(fx, { levelFrom: 41.2, levelTo: 41.3 }, { seed: 4, correction: "none" });
    expect(created.status, JSON.stringify(created.json)).toBe(201);
    await runsIdle();
    const run = (await call(runRoute, "GET", { siteId: fx.site.id, runId: created.json.id })).json;
    expect(run.status, run.error).toBe("done");
    expect(run.scope).toMatchObject({ levelFrom: 41.2, levelTo: 41.3 });
    expect(run.result.classes[0].n).toBe(inRange.filter((p) => p.cls === "FL").length);
    expect(run.result.finds[0].x).toHaveLength(n.FL);
    expect(run.params.depth.noLevel.numbers).toEqual(numbersOf(planned.filter((p) => p.cls === "FL" && p.z === null)));
    expect(run.outOfDate).toBe(false);
  });

  it("chosen spits keep exactly the finds recorded in them; finds in no spit are named", async () => {
    const { fx, pt, planned, spitId } = await depthSite();
    session.userId = fx.people.specialist.id;
    const chosen = planned.filter((p) => p.spit === 1 || p.spit === 2);
    const res = await call(
      scopeRoute,
      "GET",
      { siteId: fx.site.id },
      undefined,
      scopeQuery(fx, [fx.cls.id, pt.id], { spitIds: [spitId.get(1), spitId.get(2)].join(",") }),
    );
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    expect(res.json.totalFinds).toBe(chosen.length);
    const fl = res.json.classes.find((c: { code: string }) => c.code === "FL");
    expect(fl.n).toBe(chosen.filter((p) => p.cls === "FL").length);
    // The spit-2 finds with no level are in scope here (no level range): counted as such, not as RL 0.
    expect(fl.vertical.withLevel).toBe(chosen.filter((p) => p.cls === "FL" && p.z !== null).length);
    expect(fl.vertical.min).toBe(41.25);
    expect(res.json.depth.noSpit.numbers).toEqual(numbersOf(planned.filter((p) => p.spit === null)));
    expect(res.json.depth.spits.map((s: { label: string }) => s.label)).toEqual([
      `${fx.context.number}/1`,
      `${fx.context.number}/2`,
    ]);

    // Spits and a range together: both limits apply.
    const both = await call(
      scopeRoute,
      "GET",
      { siteId: fx.site.id },
      undefined,
      scopeQuery(fx, [fx.cls.id, pt.id], { spitIds: spitId.get(1)!, levelTo: "41.40" }),
    );
    expect(both.json.totalFinds).toBe(planned.filter((p) => p.spit === 1 && p.z !== null && p.z <= 41.4).length);
  });

  it("the stored fingerprint includes the depth limits, and a level moved out of the range puts the run out of date", async () => {
    const { fx, planned, rows } = await depthSite();
    session.userId = fx.people.specialist.id;
    const once = { seed: 4, correction: "none" } as const;
    const whole = await postRun(fx, {}, once);
    const ranged = await postRun(fx, { levelFrom: 41.1, levelTo: 41.4 }, once);
    expect(whole.status).toBe(201);
    expect(ranged.status).toBe(201);
    await runsIdle();
    // Every flint with a level lies inside 41.1–41.4: the same finds either way, yet not the same scope.
    const read = async (id: string) => (await call(runRoute, "GET", { siteId: fx.site.id, runId: id })).json;
    const [a, b] = [await read(whole.json.id), await read(ranged.json.id)];
    expect(b.result.classes[0].n).toBe(planned.filter((p) => p.cls === "FL" && p.z !== null).length);
    expect(a.fingerprint).not.toBe(b.fingerprint);

    const moved = planned.find((p) => p.cls === "FL" && p.z === 41.35)!;
    const find = rows.find((r) => r.number === moved.number)!;
    session.userId = fx.people.digger.id;
    const edit = await call(
      findRoute,
      "PATCH",
      { siteId: fx.site.id, findId: find.id },
      { z: 41.55, version: find.version },
    );
    expect(edit.status, JSON.stringify(edit.json)).toBe(200);
    expect((await read(ranged.json.id)).outOfDate).toBe(true);
  });

  it("refuses a range whose lower level is above its upper level, with a field message, and writes no run", async () => {
    const { fx } = await depthSite();
    session.userId = fx.people.specialist.id;
    const before = await runsOnSite(fx.site.id);
    const res = await postRun(fx, { levelFrom: 41.4, levelTo: 41.2 });
    expect(res.status).toBe(400);
    expect(res.json.fieldErrors["scope.levelFrom"]).toEqual([
      "The lower level (from) must not be higher than the upper level (to).",
    ]);
    const summary = await call(
      scopeRoute,
      "GET",
      { siteId: fx.site.id },
      undefined,
      scopeQuery(fx, [fx.cls.id], { levelFrom: "41.4", levelTo: "41.2" }),
    );
    expect(summary.status).toBe(400);
    expect(summary.json.fieldErrors).toHaveProperty("levelFrom");
    const word = await call(
      scopeRoute,
      "GET",
      { siteId: fx.site.id },
      undefined,
      scopeQuery(fx, [fx.cls.id], { levelFrom: "deep" }),
    );
    expect(word.status).toBe(400);
    expect(word.json.fieldErrors).toHaveProperty("levelFrom");
    expect(await runsOnSite(fx.site.id)).toBe(before);
  });

  it("refuses a spit of another context, naming the field, and writes no run", async () => {
    const { fx } = await depthSite();
    const other = await depthSite();
    session.userId = fx.people.specialist.id;
    const before = await runsOnSite(fx.site.id);
    const res = await postRun(fx, { spitIds: [other.spitId.get(1)] });
    expect(res.status).toBe(400);
    expect(res.json.fieldErrors).toHaveProperty(["scope.spitIds"]);
    expect(await runsOnSite(fx.site.id)).toBe(before);
  });
});

describe("the vertical-spread caution's threshold", () => {
  it("defaults to 0.20 m (common practice); only the director changes it; the scope summary follows it", async () => {
    const { fx, pt } = await depthSite();
    const db = await getDb();
    const threshold = async () =>
      (await db.select().from(schema.sites).where(eq(schema.sites.id, fx.site.id)))[0]!.levelSpreadCaution;
    expect(await threshold()).toBe(0.2);
    const summary = async () => {
      session.userId = fx.people.specialist.id;
      return (await call(scopeRoute, "GET", { siteId: fx.site.id }, undefined, scopeQuery(fx, [fx.cls.id, pt.id])))
        .json;
    };
    const first = await summary();
    expect(first.spreadCaution).toEqual({ threshold: 0.2, isDefault: true });
    const ptSpread = first.classes.find((c: { code: string }) => c.code === "PT").vertical;
    expect(ptSpread.spread).toBe(0.6); // 40.9 to 41.5
    expect(ptSpread.mixes).toBe(true);

    for (const role of ["digger", "specialist"] as const) {
      session.userId = fx.people[role].id;
      const refused = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { levelSpreadCaution: 0.7 });
      expect(refused.status, role).toBe(403);
    }
    expect(await threshold()).toBe(0.2);

    session.userId = fx.people.director.id;
    const bad = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { levelSpreadCaution: 0 });
    expect(bad.status).toBe(400);
    expect(bad.json.fieldErrors.levelSpreadCaution).toEqual(["The spread must be more than 0 m."]);
    expect(await threshold()).toBe(0.2);

    const ok = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { levelSpreadCaution: "0.7" });
    expect(ok.status, JSON.stringify(ok.json)).toBe(200);
    expect(await threshold()).toBe(0.7);
    const after = await summary();
    expect(after.spreadCaution).toEqual({ threshold: 0.7, isDefault: false });
    expect(after.classes.find((c: { code: string }) => c.code === "PT").vertical.mixes).toBe(false);
  });
});
