import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as importRoute from "@/app/api/sites/[siteId]/import/route";
import * as previewRoute from "@/app/api/sites/[siteId]/import/preview/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";

const mapping = { x: "E", y: "N", z: "Z", classCode: "Code", contextNumber: "Ctx" };

async function zOf(siteId: string) {
  const db = await getDb();
  const rows = await db.select().from(schema.finds).where(eq(schema.finds.siteId, siteId));
  return rows.sort((a, b) => a.number - b.number).map((f) => f.z);
}

/** The context's top and base from two spits: top 49.60 (spit 1), base 49.20 (spit 2). */
async function levelled(fx: SiteFixture) {
  const db = await getDb();
  await db.insert(schema.spits).values([
    { siteId: fx.site.id, contextId: fx.context.id, number: 1, topLevel: 49.6, baseLevel: 49.4 },
    { siteId: fx.site.id, contextId: fx.context.id, number: 2, topLevel: 49.4, baseLevel: 49.2 },
  ]);
}

describe("import: the z column's reference and levels outside their context", () => {
  it("refuses depths below the surface while the trench has no surface level, naming the trench, and writes nothing", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const csv = ["E,N,Z,Code,Ctx", `1,1,0.35,FL,${fx.context.number}`].join("\n");
    const preview = await call(previewRoute, "POST", { siteId: fx.site.id }, { csv, mapping, zReference: "depth" });
    expect(preview.json.errors).toEqual([
      {
        row: 2,
        reasons: [
          "z is a depth below the surface, but trench A has no surface level to convert it from: record the trench's surface level (RL) first, or import reduced levels",
        ],
      },
    ]);
    const refused = await call(importRoute, "POST", { siteId: fx.site.id }, { csv, mapping, zReference: "depth" });
    expect(refused.status).toBe(400);
    expect(await zOf(fx.site.id)).toEqual([]);
    const wrong = await call(previewRoute, "POST", { siteId: fx.site.id }, { csv, mapping, zReference: "height" });
    expect(wrong.status).toBe(400);
    expect(wrong.json.fieldErrors.zReference[0]).toMatch(/reduced levels \(rl\) or depths below the surface \(depth\)/);
  });

  it("converts depths with the trench's surface level (RL = surface − depth) and refuses a negative depth", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db.update(schema.trenches).set({ surfaceLevel: 50.12 }).where(eq(schema.trenches.id, fx.trench.id));
    session.userId = fx.people.digger.id;
    const c = fx.context.number;
    const bad = ["E,N,Z,Code,Ctx", `1,1,0.35,FL,${c}`, `2,1,-0.1,FL,${c}`].join("\n");
    const preview = await call(
      previewRoute,
      "POST",
      { siteId: fx.site.id },
      { csv: bad, mapping, zReference: "depth" },
    );
    expect(preview.json.errors).toEqual([
      { row: 3, reasons: ['z "-0.1" is a depth below the surface, so it cannot be negative'] },
    ]);
    const csv = ["E,N,Z,Code,Ctx", `1,1,0.35,FL,${c}`, `2,1,1.005,FL,${c}`, `3,1,,FL,${c}`].join("\n");
    const done = await call(importRoute, "POST", { siteId: fx.site.id }, { csv, mapping, zReference: "depth" });
    expect(done.status, JSON.stringify(done.json)).toBe(201);
    // 50.12 − 0.35 = 49.77; 50.12 − 1.005 = 49.115; no z stays no level (null), never the surface.
    expect(await zOf(fx.site.id)).toEqual([49.77, 49.115, null]);
  });

  it("warns of rows whose level lies outside the context's recorded top and base, counts them, and imports them", async () => {
    const fx = await makeSite();
    await levelled(fx);
    session.userId = fx.people.digger.id;
    const c = fx.context.number;
    // The site's tolerance is 5 mm: 49.604 is within it above the top; 49.65 and 49.10 are not.
    const csv = [
      "E,N,Z,Code,Ctx",
      `1,1,49.5,FL,${c}`,
      `2,1,49.65,FL,${c}`,
      `3,1,49.604,FL,${c}`,
      `4,1,49.1,FL,${c}`,
      `5,1,,FL,${c}`,
    ].join("\n");
    const preview = await call(previewRoute, "POST", { siteId: fx.site.id }, { csv, mapping });
    expect(preview.json.errors).toEqual([]);
    expect(preview.json.validCount).toBe(5);
    expect(preview.json.warnings).toEqual([
      { row: 3, reasons: [`RL 49.650 lies 50 mm above the recorded top of context ${c} (49.600)`] },
      { row: 5, reasons: [`RL 49.100 lies 100 mm below the recorded base of context ${c} (49.200)`] },
    ]);
    const done = await call(importRoute, "POST", { siteId: fx.site.id }, { csv, mapping });
    expect(done.status).toBe(201);
    expect(done.json.imported).toBe(5);
    expect(done.json.warnings).toBe(2);
  });
});

describe("the find form's level warning", () => {
  it("a find saved outside its context's recorded top and base is saved with a warning; inside, without", async () => {
    const fx = await makeSite();
    await levelled(fx);
    session.userId = fx.people.digger.id;
    const base = { contextId: fx.context.id, classId: fx.cls.id, x: 1, y: 1 };
    const high = await call(findsRoute, "POST", { siteId: fx.site.id }, { ...base, z: 49.75 });
    expect(high.status).toBe(201);
    expect(high.json.levelWarning).toBe(
      `Find saved, but check its level: RL 49.750 lies 150 mm above the recorded top of context ${fx.context.number} (49.600).`,
    );
    const fine = await call(findsRoute, "POST", { siteId: fx.site.id }, { ...base, z: 49.3 });
    expect(fine.json.levelWarning).toBeNull();
    const moved = await call(findRoute, "PATCH", { siteId: fx.site.id, findId: fine.json.id }, { z: 49.0 });
    expect(moved.status).toBe(200);
    expect(moved.json.levelWarning).toMatch(/RL 49.000 lies 200 mm below the recorded base/);
    expect(moved.json.z).toBe(49);
  });
});
