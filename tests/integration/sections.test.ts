import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import * as sectionsRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/sections/route";
import * as sectionRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/sections/[sectionId]/route";
import * as exportRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/sections/[sectionId]/export/route";

/**
 * Finds placed by hand around a line from (0, 1) to (4, 1), band 0.5 m: 1, 2 and 5 inside; 3 off the band; 4 past the
 * end; 6 no level.
 */
async function arrange(fx: SiteFixture) {
  const db = await getDb();
  const at = [
    [1, 1, 1.2, 49.5],
    [2, 2, 0.6, 49.42],
    [3, 2, 1.8, 49.4],
    [4, 4.5, 1, 49.3],
    [5, 3, 1, 49.25],
    [6, 1.5, 1, null],
  ] as const;
  await db.insert(schema.finds).values(
    at.map(([n, x, y, z]) => ({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId: fx.context.id,
      classId: fx.cls.id,
      number: n,
      x,
      y,
      z,
      method: "plan" as const,
    })),
  );
  await db.insert(schema.spits).values([
    { siteId: fx.site.id, contextId: fx.context.id, number: 1, topLevel: 49.6, baseLevel: 49.4 },
    { siteId: fx.site.id, contextId: fx.context.id, number: 2, topLevel: 49.4, baseLevel: 49.2 },
  ]);
}

const body = { name: "S1", startX: 0, startY: 1, endX: 4, endY: 1, halfWidth: 0.5, exaggeration: 2 };

async function exportAs(fx: SiteFixture, sectionId: string, format: string) {
  const url = new URL(`http://localhost/api/test?format=${format}`);
  return exportRoute.GET(new Request(url), {
    params: Promise.resolve({ siteId: fx.site.id, trenchId: fx.trench.id, sectionId }),
  });
}

describe("sections of finds", () => {
  it("saves a section per trench; its SVG draws exactly the finds in the band, with band, exaggeration and context levels", async () => {
    const fx = await makeSite();
    await arrange(fx);
    session.userId = fx.people.specialist.id;
    const res = await call(sectionsRoute, "POST", { siteId: fx.site.id, trenchId: fx.trench.id }, body);
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    const list = await call(sectionsRoute, "GET", { siteId: fx.site.id, trenchId: fx.trench.id });
    expect(list.json.map((s: { name: string }) => s.name)).toEqual(["S1"]);

    const svgRes = await exportAs(fx, res.json.id, "svg");
    expect(svgRes.headers.get("content-type")).toBe("image/svg+xml");
    const svg = await svgRes.text();
    expect([...svg.matchAll(/data-find="(\d+)"/g)].map((m) => Number(m[1]))).toEqual([1, 2, 5]);
    expect(svg).toContain("Band ±0.50 m · vertical exaggeration ×2");
    expect(svg).toContain("no level and are not drawn: 6.");
    // Spit 1's top and spit 2's base are the context's top and base.
    expect(svg).toMatch(new RegExp(`data-horizon="${fx.context.number}" data-kind="top"`));
    expect(svg).toContain(`${fx.context.number} base`);

    const csv = await (await exportAs(fx, res.json.id, "csv")).text();
    expect(csv.split("\r\n")).toEqual([
      "number,context,class,along_m,offset_m,z_rl_m",
      `1,${fx.context.number},FL,1,0.2,49.5`,
      `2,${fx.context.number},FL,2,-0.4,49.42`,
      `5,${fx.context.number},FL,3,0,49.25`,
    ]);

    const png = new Uint8Array(await (await exportAs(fx, res.json.id, "png")).arrayBuffer());
    expect([...png.slice(0, 4)]).toEqual([0x89, 0x50, 0x4e, 0x47]);
    expect((await exportAs(fx, res.json.id, "pdf")).status).toBe(400);

    const db = await getDb();
    const audit = await db
      .select()
      .from(schema.auditEntries)
      .where(and(eq(schema.auditEntries.recordType, "section"), eq(schema.auditEntries.recordId, res.json.id)));
    expect(audit.map((a) => a.action)).toEqual(["create"]);
  });

  it("refuses a line of no length, a band of no width and a name already used, writing nothing", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const params = { siteId: fx.site.id, trenchId: fx.trench.id };
    const flat = await call(sectionsRoute, "POST", params, { ...body, endX: 0, endY: 1 });
    expect(flat.status).toBe(400);
    expect(flat.json.fieldErrors.endX[0]).toMatch(/at least a millimetre long/);
    const thin = await call(sectionsRoute, "POST", params, { ...body, halfWidth: 0 });
    expect(thin.status).toBe(400);
    expect(thin.json.fieldErrors.halfWidth[0]).toMatch(/wider than 0 m/);
    const steep = await call(sectionsRoute, "POST", params, { ...body, exaggeration: "a lot" });
    expect(steep.json.fieldErrors.exaggeration[0]).toMatch(/vertical exaggeration/);
    expect((await call(sectionsRoute, "GET", params)).json).toEqual([]);
    expect((await call(sectionsRoute, "POST", params, body)).status).toBe(201);
    const again = await call(sectionsRoute, "POST", params, body);
    expect(again.status).toBe(409);
    expect(again.json.error).toBe("Trench A already has a section named S1.");
  });

  it("a section of another site's trench is not found, and a deleted section leaves its row in the audit", async () => {
    const fx = await makeSite();
    const other = await makeSite();
    session.userId = fx.people.digger.id;
    expect((await call(sectionsRoute, "POST", { siteId: fx.site.id, trenchId: other.trench.id }, body)).status).toBe(
      404,
    );
    const made = await call(sectionsRoute, "POST", { siteId: fx.site.id, trenchId: fx.trench.id }, body);
    expect((await exportAs(other, made.json.id, "svg")).status).toBe(404);
    const gone = await call(sectionRoute, "DELETE", {
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      sectionId: made.json.id,
    });
    expect(gone.status).toBe(200);
    const db = await getDb();
    const [entry] = await db
      .select()
      .from(schema.auditEntries)
      .where(and(eq(schema.auditEntries.recordId, made.json.id), eq(schema.auditEntries.action, "delete")));
    expect((entry!.before as { halfWidth: number }).halfWidth).toBe(0.5);
  });
});
