import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { eq } from "drizzle-orm";
import { session } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { REDUCED_LEVEL_WORDS } from "@/lib/schemas/common";
import { signedArea2 } from "@/lib/server/export/geojson";
import * as exportFindsRoute from "@/app/api/sites/[siteId]/export/finds/route";
import * as exportTrenchesRoute from "@/app/api/sites/[siteId]/export/trenches/route";
import * as exportContextsRoute from "@/app/api/sites/[siteId]/export/contexts/route";
import * as matrixImageRoute from "@/app/api/sites/[siteId]/matrix/image/route";

async function get(mod: { GET: Function }, siteId: string, query: string) {
  const res: Response = await mod.GET(new Request(`http://localhost/x?${query}`), {
    params: Promise.resolve({ siteId }),
  });
  return res;
}

/** A ring drawn clockwise on purpose, to prove the export re-orients it. */
const clockwiseExtent = {
  type: "Polygon" as const,
  coordinates: [
    [
      [1, 1],
      [1, 3],
      [3, 3],
      [3, 1],
      [1, 1],
    ] as [number, number][],
  ],
};

/** UTM zone 30N on WGS 84: the grid origin on the zone's central meridian (3° W) at the equator. */
const utm30 = "+proj=utm +zone=30 +datum=WGS84 +units=m +no_defs";

describe("GeoJSON exports (RFC 7946)", () => {
  it("writes trench outlines and context extents with exterior rings counter-clockwise and holes clockwise", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db.update(schema.contexts).set({ extent: clockwiseExtent }).where(eq(schema.contexts.id, fx.context.id));
    await db
      .update(schema.sites)
      .set({ crs: utm30, gridOriginX: 500000, gridOriginY: 0 })
      .where(eq(schema.sites.id, fx.site.id));
    session.userId = fx.people.specialist.id;
    const trenches = await (await get(exportTrenchesRoute, fx.site.id, "")).json();
    expect(trenches.type).toBe("FeatureCollection");
    const [outer, hole] = trenches.features[0].geometry.coordinates;
    // RFC 7946 §3.1.6: exterior rings counter-clockwise (positive shoelace area), holes clockwise; rings closed.
    expect(signedArea2(outer)).toBeGreaterThan(0);
    expect(signedArea2(hole)).toBeLessThan(0);
    // In longitude/latitude a few metres from the equator the areas keep their ratio: the fixture's
    // 2 m × 1 m baulk in its 10 m × 6 m trench.
    expect(Math.abs(signedArea2(hole) / signedArea2(outer))).toBeCloseTo(2 / 60, 6);
    for (const ring of [outer, hole]) expect(ring[0]).toEqual(ring[ring.length - 1]);
    const extents = await (await get(exportContextsRoute, fx.site.id, "format=geojson")).json();
    const extent = extents.features.find((f: any) => f.properties.number === fx.context.number);
    expect(signedArea2(extent.geometry.coordinates[0])).toBeGreaterThan(0);
    const empty = extents.features.filter((f: any) => f.properties.number !== fx.context.number);
    for (const f of empty) expect(f.geometry).toBeNull();
  });

  it("writes finds as longitude, latitude (, RL) through the site's CRS, and refuses site-grid numbers", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db.insert(schema.finds).values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId: fx.context.id,
      classId: fx.cls.id,
      number: 7,
      x: 2.5,
      y: 4,
      z: 10.25,
      method: "typed",
    });
    session.userId = fx.people.digger.id;
    // Unplaced, the site has no longitude/latitude to give, and GeoJSON can hold nothing else (RFC 7946 §4).
    const refused = await get(exportFindsRoute, fx.site.id, "format=geojson");
    expect(refused.status).toBe(400);
    expect((await refused.json()).error).toMatch(/GeoPackage/);
    // Grid origin at UTM zone 30N (500000 m E, 0 m N): the zone's central meridian, 3° W, on the equator
    // (UTM definition: false easting 500 000 m on the central meridian, zone 30 centred on 3° W).
    await db
      .update(schema.sites)
      .set({ crs: utm30, gridOriginX: 500000 - 2.5, gridOriginY: -4 })
      .where(eq(schema.sites.id, fx.site.id));
    const lonlat = await (await get(exportFindsRoute, fx.site.id, "format=geojson")).json();
    const [lon, lat, z] = lonlat.features[0].geometry.coordinates;
    // RFC 7946 §3.1.1: longitude first, then latitude, then elevation.
    expect(lon).toBeCloseTo(-3, 9);
    expect(lat).toBeCloseTo(0, 9);
    expect(z).toBe(10.25);
    // The file says what that third number is: a reduced level against the site's datum (a foreign member).
    expect(lonlat.heights).toEqual({ z: REDUCED_LEVEL_WORDS, datum: fx.site.datumName, datumKind: fx.site.datumKind });
    for (const coords of ["grid", "crs"]) {
      const res = await get(exportFindsRoute, fx.site.id, `format=geojson&coords=${coords}`);
      expect(res.status).toBe(400);
      expect((await res.json()).fieldErrors.coords[0]).toMatch(/WGS 84 longitude\/latitude only/);
    }
  });
});

describe("CSV and matrix image exports", () => {
  it("writes the contexts CSV with relations read from each side, and the matrix as SVG and PNG", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [upper] = await db
      .insert(schema.contexts)
      .values({ siteId: fx.site.id, trenchId: fx.trench.id, number: 1, type: "layer" })
      .returning();
    await db
      .insert(schema.contextRelations)
      .values({ siteId: fx.site.id, fromId: upper.id, toId: fx.context.id, kind: "above" });
    session.userId = fx.people.digger.id;
    const csv = await (await get(exportContextsRoute, fx.site.id, "format=csv")).text();
    const lines = csv.trim().split("\r\n");
    expect(lines[0]).toBe(
      "number,trench,type,state,colour,compaction,composition,inclusions,description,interpretation,relations,finds,has_extent,signed_off_at",
    );
    expect(lines[1]).toContain(`1,A,layer,open,,,,,,,above ${fx.context.number},0,no,`);
    expect(lines[2]).toContain(`below 1`);
    const svg = await get(matrixImageRoute, fx.site.id, "format=svg");
    expect(svg.headers.get("content-type")).toBe("image/svg+xml");
    const text = await svg.text();
    expect(text.startsWith("<svg")).toBe(true);
    expect(text).toContain(`>${fx.context.number}</text>`);
    const png = new Uint8Array(await (await get(matrixImageRoute, fx.site.id, "format=png")).arrayBuffer());
    // PNG signature, PNG specification §5.2: 89 50 4E 47 0D 0A 1A 0A.
    expect([...png.slice(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  });
});

/** Text a spreadsheet would evaluate: OWASP's CSV-injection triggers, a full-width one, one after blanks. */
const formulas = {
  minus: "-2+3+cmd|' /C calc'!A0",
  equals: '=HYPERLINK("http://example.invalid","x")',
  plus: "+1+1",
  at: "@SUM(1+1)",
  tab: "\t=1+1",
  cr: "\r=1+1",
  fullWidth: "\uFF0D1+1",
  blanks: "  =1+1",
};

describe("CSV exports against spreadsheet formulas", () => {
  it("writes numbers as numbers (negative ones too) and every formula-like text cell of the finds CSV inert", async () => {
    const fx = await makeSite();
    const db = await getDb();
    let number = 1;
    for (const text of Object.values(formulas)) {
      await db.insert(schema.finds).values({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        contextId: fx.context.id,
        classId: fx.cls.id,
        number: number++,
        x: -1.5,
        y: -0.25,
        z: -3,
        weightG: 12.5,
        description: text,
        method: "typed",
      });
    }
    session.userId = fx.people.digger.id;
    const csv = await (await get(exportFindsRoute, fx.site.id, "format=csv&sort=number&dir=asc")).text();
    const [head, ...rows] = Papa.parse<string[]>(csv.trim(), { newline: "\r\n" }).data;
    const col = (name: string) => head.indexOf(name);
    // OWASP, "CSV Injection": a cell starting with = + - @ tab or CR gets a leading single quote.
    expect(rows.map((r) => r[col("description")])).toEqual(Object.values(formulas).map((t) => `'${t}`));
    // …and wraps it in double quotes; the numbers stay bare.
    expect(csv).toContain(`,"'-2+3+cmd|' /C calc'!A0",`);
    expect(csv).toContain(",-1.5,-0.25,-3,,12.5,");
    for (const r of rows) {
      expect([r[col("x")], r[col("y")], r[col("z_rl_m")], r[col("weight_g")]]).toEqual(["-1.5", "-0.25", "-3", "12.5"]);
      expect(r[col("count")]).toBe("");
    }
  });

  it("writes every formula-like text field of the contexts CSV inert and the numbers as numbers", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const fields = {
      colour: formulas.plus,
      compaction: formulas.blanks,
      composition: formulas.tab,
      inclusions: formulas.fullWidth,
      description: formulas.minus,
      interpretation: formulas.at,
    };
    await db.update(schema.contexts).set(fields).where(eq(schema.contexts.id, fx.context.id));
    session.userId = fx.people.digger.id;
    const csv = await (await get(exportContextsRoute, fx.site.id, "format=csv")).text();
    const [head, ...rows] = Papa.parse<string[]>(csv.trim(), { newline: "\r\n" }).data;
    const row = rows.find((r) => r[head.indexOf("number")] === String(fx.context.number))!;
    for (const [field, text] of Object.entries(fields)) expect(row[head.indexOf(field)]).toBe(`'${text}`);
    expect(row[head.indexOf("finds")]).toBe("0");
  });
});
