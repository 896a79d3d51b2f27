import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { unzipSync } from "fflate";
import { and, eq, isNotNull } from "drizzle-orm";
import { session } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { seedDemoSite, type DemoSite } from "../support/demo-site";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { DEMO_PLACEMENT } from "@/scripts/seed/demo-placement";
import * as gisRoute from "@/app/api/sites/[siteId]/export/gis/route";
import * as findsExportRoute from "@/app/api/sites/[siteId]/export/finds/route";
import * as trenchesExportRoute from "@/app/api/sites/[siteId]/export/trenches/route";
import * as packageRoute from "@/app/api/sites/[siteId]/export/package/route";

/*
 * GDAL (Debian's gdal-bin, the library under most desktop GIS) is the outside reader: each export is
 * written to a file and opened with `ogrinfo`, and what GDAL reports (CRS, extent, feature count) is
 * checked against the site's own records as stored, transformed here independently with `gdaltransform`
 * (PROJ's own EPSG:27700 definition, not Loamwork's proj4 code or WKT).
 */

const dir = mkdtempSync(join(tmpdir(), "loamwork-gis-"));
let demo: DemoSite;

async function download(mod: { GET: Function }, siteId: string, query: string, name: string) {
  const res: Response = await mod.GET(new Request(`http://localhost/x?${query}`), {
    params: Promise.resolve({ siteId }),
  });
  const bytes = new Uint8Array(await res.arrayBuffer());
  const file = join(dir, name);
  writeFileSync(file, bytes);
  return { res, file, text: () => new TextDecoder().decode(bytes) };
}

type LayerInfo = { count: number; extent: [number, number, number, number] | null; wkt: string; geometry: string };

/** `ogrinfo -al -so` read layer by layer: feature count, extent (minX, minY, maxX, maxY), the CRS as WKT2. */
function ogrinfo(file: string): Map<string, LayerInfo> {
  const out = execFileSync("ogrinfo", ["-ro", "-al", "-so", "-wkt_format", "WKT2", file], { encoding: "utf8" });
  const layers = new Map<string, LayerInfo>();
  for (const block of out.split(/^Layer name: /m).slice(1)) {
    const name = block.slice(0, block.indexOf("\n")).trim();
    const num = "(-?[\\d.]+)";
    const e = new RegExp(`^Extent: \\(${num}, ${num}\\) - \\(${num}, ${num}\\)`, "m").exec(block);
    layers.set(name, {
      count: Number(/^Feature Count: (\d+)/m.exec(block)?.[1]),
      extent: e ? [Number(e[1]), Number(e[2]), Number(e[3]), Number(e[4])] : null,
      wkt: /^Layer SRS WKT:\n([\s\S]*?)\n(?=Data axis|\S+:)/m.exec(block)?.[1]?.replace(/\s+/g, " ") ?? "",
      geometry: /^Geometry: (.*)$/m.exec(block)?.[1] ?? "",
    });
  }
  return layers;
}

/** National Grid eastings/northings to WGS 84 longitude/latitude by GDAL's own transformation. */
function toLonLat(points: [number, number][]): [number, number][] {
  const out = execFileSync(
    "gdaltransform",
    ["-s_srs", `EPSG:${DEMO_PLACEMENT.epsg}`, "-t_srs", "OGC:CRS84", "-output_xy"],
    {
      input: points.map(([x, y]) => `${x} ${y}`).join("\n") + "\n",
      encoding: "utf8",
    },
  );
  return out
    .trim()
    .split("\n")
    .map((line) => line.trim().split(/\s+/).map(Number) as [number, number]);
}

const extentOf = (pts: [number, number][]): [number, number, number, number] => [
  Math.min(...pts.map((p) => p[0])),
  Math.min(...pts.map((p) => p[1])),
  Math.max(...pts.map((p) => p[0])),
  Math.max(...pts.map((p) => p[1])),
];
const placed = (pts: [number, number][]) =>
  pts.map(([x, y]) => [x + DEMO_PLACEMENT.gridOriginX, y + DEMO_PLACEMENT.gridOriginY] as [number, number]);

/** ogrinfo prints extents with six decimals: compare to within that, or within `tol` where stated. */
function expectExtent(got: LayerInfo["extent"], want: [number, number, number, number], tol = 1e-6) {
  expect(got).not.toBeNull();
  got!.forEach((v, k) => expect(Math.abs(v - want[k]!)).toBeLessThanOrEqual(tol));
}

async function demoRecords() {
  const db = await getDb();
  const finds = await db.select({ x: s.finds.x, y: s.finds.y }).from(s.finds).where(eq(s.finds.siteId, demo.siteId));
  const trenches = await db.select().from(s.trenches).where(eq(s.trenches.siteId, demo.siteId));
  const extents = await db
    .select({ id: s.contexts.id })
    .from(s.contexts)
    .where(and(eq(s.contexts.siteId, demo.siteId), isNotNull(s.contexts.extent)));
  const vertices = trenches.flatMap((t) => t.outline!.coordinates.flat() as [number, number][]);
  return { finds: finds.map((f) => [f.x, f.y] as [number, number]), trenches, vertices, extents };
}

beforeAll(async () => {
  demo = await seedDemoSite();
  const db = await getDb();
  const [ctx] = await db.select().from(s.contexts).where(eq(s.contexts.siteId, demo.siteId)).limit(1);
  // Two samples with a position and one without: only the positioned ones are drawn.
  await db
    .insert(s.samples)
    .values(
      [
        { x: 3.25, y: 1.5, z: 49.1 },
        { x: 4.75, y: 2.25, z: null },
        { x: null, y: null, z: null },
      ].map((p, k) => ({
        ...p,
        siteId: demo.siteId,
        trenchId: ctx!.trenchId,
        contextId: ctx!.id,
        number: 9001 + k,
        type: "bulk" as const,
        takenOn: "2026-07-02",
      })),
    )
    .onConflictDoNothing();
}, 120_000);

describe("GeoPackage of the GIS layers, read by GDAL", () => {
  it("holds every layer in the site grid as an engineering CRS, in EPSG:27700 and in WGS 84, where the records are", async () => {
    session.userId = demo.people.digger!;
    const { res, file } = await download(gisRoute, demo.siteId, "", "demo.gpkg");
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/geopackage+sqlite3");
    const layers = ogrinfo(file);
    const kinds = ["trenches", "contexts", "finds", "samples"];
    expect([...layers.keys()].sort()).toEqual(
      ["site_grid", "projected", "wgs84"].flatMap((sfx) => kinds.map((k) => `${k}_${sfx}`)).sort(),
    );
    const rec = await demoRecords();
    const samples: [number, number][] = [
      [3.25, 1.5],
      [4.75, 2.25],
    ];
    const counts = { trenches: rec.trenches.length, contexts: rec.extents.length, finds: rec.finds.length, samples: 2 };
    expect(rec.finds.length).toBeGreaterThan(100);
    for (const [sfx, crs] of [
      ["site_grid", /^ENGCRS\["WHD26 site grid"/],
      ["projected", /^PROJCRS\["OSGB36 \/ British National Grid".*ID\["EPSG",27700\]\]$/],
      ["wgs84", /^GEOGCRS\["WGS 84".*ID\["EPSG",4326\]\]$/],
    ] as const) {
      for (const k of kinds) {
        const layer = layers.get(`${k}_${sfx}`)!;
        expect(layer.wkt, `${k}_${sfx}`).toMatch(crs);
        expect(layer.count, `${k}_${sfx}`).toBe(counts[k as keyof typeof counts]);
      }
    }
    expect(layers.get("finds_site_grid")!.geometry).toBe("3D Point");
    expect(layers.get("trenches_site_grid")!.geometry).toBe("Polygon");
    // Extents against the stored site-grid coordinates, the same plus the grid origin on the National Grid,
    // and those National Grid points taken to WGS 84 by GDAL (both sides apply EPSG transformation 1314 here,
    // so 1e-6° ≈ 0.1 m is ogrinfo's printing, not slack).
    for (const [k, pts] of [
      ["finds", rec.finds],
      ["trenches", rec.vertices],
      ["samples", samples],
    ] as const) {
      expectExtent(layers.get(`${k}_site_grid`)!.extent, extentOf([...pts]));
      expectExtent(layers.get(`${k}_projected`)!.extent, extentOf(placed([...pts])));
      expectExtent(layers.get(`${k}_wgs84`)!.extent, extentOf(toLonLat(placed([...pts]))), 2e-6);
    }
  });

  it("keeps a trench's baulk as a hole, and an unplaced site gets its site-grid layers only", async () => {
    const fx = await makeSite();
    session.userId = fx.people.specialist.id;
    const { file } = await download(gisRoute, fx.site.id, "", "unplaced.gpkg");
    const layers = ogrinfo(file);
    expect([...layers.keys()].sort()).toEqual([
      "contexts_site_grid",
      "finds_site_grid",
      "samples_site_grid",
      "trenches_site_grid",
    ]);
    const json = JSON.parse(
      execFileSync("ogr2ogr", ["-f", "GeoJSON", "/vsistdout/", file, "trenches_site_grid"], { encoding: "utf8" }),
    );
    const [outer, hole] = json.features[0].geometry.coordinates as [number, number][][];
    const area = (ring: [number, number][]) =>
      Math.abs(ring.slice(1).reduce((a, p, k) => a + ring[k]![0] * p[1] - p[0] * ring[k]![1], 0)) / 2;
    expect(area(outer!)).toBeCloseTo(60, 9); // the fixture's 10 m × 6 m trench
    expect(area(hole!)).toBeCloseTo(2, 9); // and its 2 m × 1 m baulk
    expect(json.features[0].properties).toMatchObject({ code: "A", signed_off: false });

    // Placed by a bare proj4 definition: WGS 84 layers, but no projected ones, as no WKT names the system.
    await (
      await getDb()
    )
      .update(s.sites)
      .set({ crs: "+proj=utm +zone=30 +datum=WGS84 +units=m +no_defs", gridOriginX: 500000 })
      .where(eq(s.sites.id, fx.site.id));
    const proj4Only = ogrinfo((await download(gisRoute, fx.site.id, "", "proj4.gpkg")).file);
    expect([...proj4Only.keys()].filter((k) => !k.endsWith("_site_grid")).sort()).toEqual([
      "contexts_wgs84",
      "finds_wgs84",
      "samples_wgs84",
      "trenches_wgs84",
    ]);
    // UTM 30N's false easting lies on its central meridian, 3° W (UTM definition), on the equator.
    const outline = proj4Only.get("trenches_wgs84")!.extent!;
    expect(outline[0]).toBeCloseTo(-3, 6);
    expect(outline[1]).toBeCloseTo(0, 6);

    session.userId = fx.people.stranger.id;
    expect((await download(gisRoute, fx.site.id, "", "stranger.gpkg")).res.status).toBe(404);
  });
});

describe("the deposition package's GIS data", () => {
  it("holds the GeoPackage without its finds layers, which GDAL opens, and its readme names it", async () => {
    session.userId = demo.people.director!;
    const { res, file } = await download(packageRoute, demo.siteId, "", "package.zip");
    expect(res.status).toBe(200);
    const entries = unzipSync(new Uint8Array(readFileSync(file)));
    const name = Object.keys(entries).find((k) => k.endsWith("/data/gis/site.gpkg"));
    expect(name).toBeDefined();
    const gpkg = join(dir, "package-site.gpkg");
    writeFileSync(gpkg, entries[name!]!);
    const layers = ogrinfo(gpkg);
    // The finds stay in the paged register and GeoJSON, so the package's memory does not grow with them.
    expect([...layers.keys()].filter((k) => k.startsWith("finds_"))).toEqual([]);
    expect(layers.size).toBe(9);
    const rec = await demoRecords();
    expect(layers.get("trenches_site_grid")!.count).toBe(rec.trenches.length);
    expect(layers.get("contexts_wgs84")!.count).toBe(rec.extents.length);
    expect(layers.get("trenches_projected")!.wkt).toMatch(/ID\["EPSG",27700\]\]$/);
    const readme = new TextDecoder().decode(entries[name!.replace("gis/site.gpkg", "README.txt")]);
    expect(readme).toContain("gis/site.gpkg");
  });
});

describe("GeoJSON, WGS 84 only (RFC 7946 §4)", () => {
  it("puts the demo site's finds at its place on Earth, not at (10° E, 3° N) as site-grid metres would", async () => {
    session.userId = demo.people.director!;
    const { res, file } = await download(findsExportRoute, demo.siteId, "format=geojson", "finds.geojson");
    expect(res.status).toBe(200);
    const layer = [...ogrinfo(file).values()][0]!;
    // WGS 84, as GDAL names it for GeoJSON with a third coordinate: EPSG:4979, its 3D form.
    expect(layer.wkt).toMatch(/^GEOGCRS\["WGS 84".*ID\["EPSG",(4326|4979)\]\]$/);
    const rec = await demoRecords();
    expect(layer.count).toBe(rec.finds.length);
    expectExtent(layer.extent, extentOf(toLonLat(placed(rec.finds))), 2e-6);
    // In the north of England (the invented placement), thousands of kilometres from (10° E, 3° N).
    expect(layer.extent![0]).toBeGreaterThan(-3);
    expect(layer.extent![2]).toBeLessThan(-1);
    expect(layer.extent![1]).toBeGreaterThan(54);
  });

  it("refuses GeoJSON of an unplaced site, or in site-grid or projected numbers, pointing to the GeoPackage", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    for (const [mod, query] of [
      [findsExportRoute, "format=geojson"],
      [trenchesExportRoute, ""],
    ] as const) {
      const res = await download(mod, fx.site.id, query, "refused.geojson");
      expect(res.res.status).toBe(400);
      expect(JSON.parse(res.text()).error).toMatch(/not placed.*GeoPackage/);
    }
    session.userId = demo.people.digger!;
    const grid = await download(findsExportRoute, demo.siteId, "format=geojson&coords=grid", "grid.geojson");
    expect(grid.res.status).toBe(400);
    const body = JSON.parse(grid.text());
    expect(body.fieldErrors.coords[0]).toMatch(/GeoJSON.*WGS 84.*GeoPackage/);
  });
});
