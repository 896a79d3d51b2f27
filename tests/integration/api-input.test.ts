import { describe, expect, it } from "vitest";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { eq } from "drizzle-orm";
import * as trenchesRoute from "@/app/api/sites/[siteId]/trenches/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as contextsRoute from "@/app/api/sites/[siteId]/contexts/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import { buildOpenApiDocument } from "@/lib/server/openapi";
import { api } from "@/lib/server/api-catalog";
import { DEMO_PLACEMENT } from "@/scripts/seed/demo-placement";

const ring = (pts: number[][]) => pts as [number, number][];

/** A find at (x, y) in the fixture's context, recorded by whoever the session holds. */
const findAt = (fx: SiteFixture, x: number, y: number) =>
  call(findsRoute, "POST", { siteId: fx.site.id }, { contextId: fx.context.id, classId: fx.cls.id, x, y });

/** The fixture's trench outline cut down to the 5 m square at the grid's origin. */
const shrinkTo5m = (fx: SiteFixture) =>
  call(
    trenchRoute,
    "PATCH",
    { siteId: fx.site.id, trenchId: fx.trench.id },
    {
      outline: {
        type: "Polygon",
        coordinates: [
          ring([
            [0, 0],
            [5, 0],
            [5, 5],
            [0, 5],
          ]),
        ],
      },
    },
  );

describe("bad input is refused with the reason and changes nothing", () => {
  const badOutlines: [string, [number, number][][], RegExp][] = [
    [
      "self-crossing (a bow tie)",
      [
        ring([
          [0, 0],
          [4, 4],
          [4, 0],
          [0, 4],
        ]),
      ],
      /crosses or touches itself/,
    ],
    [
      "fewer than 3 distinct vertices",
      [
        ring([
          [0, 0],
          [1, 1],
          [1, 1],
          [0, 0],
        ]),
      ],
      /at least 3 distinct vertices/,
    ],
    [
      "a hole outside the outer ring",
      [
        ring([
          [0, 0],
          [4, 0],
          [4, 4],
          [0, 4],
        ]),
        ring([
          [5, 5],
          [6, 5],
          [6, 6],
          [5, 6],
        ]),
      ],
      /Hole 1 is not strictly inside/,
    ],
    [
      "two overlapping holes",
      [
        ring([
          [0, 0],
          [9, 0],
          [9, 9],
          [0, 9],
        ]),
        ring([
          [1, 1],
          [4, 1],
          [4, 4],
          [1, 4],
        ]),
        ring([
          [3, 3],
          [6, 3],
          [6, 6],
          [3, 6],
        ]),
      ],
      /overlap or touch/,
    ],
  ];
  for (const [what, coordinates, reason] of badOutlines) {
    it(`refuses a trench outline with ${what}`, async () => {
      const fx = await makeSite();
      session.userId = fx.people.digger.id;
      const res = await call(
        trenchesRoute,
        "POST",
        { siteId: fx.site.id },
        { code: "X", outline: { type: "Polygon", coordinates } },
      );
      expect(res.status).toBe(400);
      expect(res.json.fieldErrors.outline[0]).toMatch(reason);
      const db = await getDb();
      expect(await db.select().from(schema.trenches).where(eq(schema.trenches.code, "X"))).toHaveLength(0);
    });
  }

  it("refuses a self-crossing context extent, naming the extent, and leaves the context as it was", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const res = await call(
      contextRoute,
      "PATCH",
      { siteId: fx.site.id, contextId: fx.context.id },
      { extent: { type: "Polygon", coordinates: badOutlines[0][1] } },
    );
    expect(res.status).toBe(400);
    expect(res.json.error).toMatch(/^The context's extent is not valid: .*crosses or touches itself/);
    expect(res.json.fieldErrors.extent[0]).toMatch(/crosses or touches itself/);
    const db = await getDb();
    const [row] = await db.select().from(schema.contexts).where(eq(schema.contexts.id, fx.context.id));
    expect(row.extent).toBeNull();
  });

  it("refuses a find outside its trench, stating the distance to the edge", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    // Trench A is 10 × 6 m from (0, 0); (12, 3) is 2 m east of its edge. Inside the baulk (5, 2.5) is 0.5 m from the
    // hole's edge.
    const outside = await findAt(fx, 12, 3);
    expect(outside.status).toBe(400);
    expect(outside.json.details.distance).toBeCloseTo(2, 9);
    expect(outside.json.error).toMatch(/2\.000 m outside/);
    const inBaulk = await findAt(fx, 5, 2.5);
    expect(inBaulk.status).toBe(400);
    expect(inBaulk.json.details.distance).toBeCloseTo(0.5, 9);
    const db = await getDb();
    expect(await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id))).toHaveLength(0);
    const [site] = await db.select().from(schema.sites).where(eq(schema.sites.id, fx.site.id));
    expect(site.nextFindNumber).toBe(1);
  });

  it("names each bad field and allocates numbers 1, 2 for the good finds", async () => {
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    const bad = await call(
      findsRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: "nope", classId: fx.cls.id, x: "east", y: 1, count: 0 },
    );
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.json.fieldErrors).sort()).toEqual(["contextId", "count", "x"]);
    const a = await call(
      findsRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: fx.context.id, classId: fx.cls.id, x: 1, y: 1 },
    );
    const b = await call(
      findsRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: fx.context.id, classId: fx.cls.id, x: "2.5", y: 1 },
    );
    expect([a.status, b.status]).toEqual([201, 201]);
    expect([a.json.number, b.json.number]).toEqual([1, 2]);
    expect(b.json.x).toBe(2.5);
  });

  it("refuses a duplicate context number with 409 and a malformed body with 400", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const dup = await call(
      contextsRoute,
      "POST",
      { siteId: fx.site.id },
      { trenchId: fx.trench.id, number: fx.context.number, type: "fill" },
    );
    expect(dup.status).toBe(409);
    expect(dup.json.error).toMatch(new RegExp(`Context ${fx.context.number} already exists`));
    const req = new Request("http://localhost/api/x", { method: "POST", body: "{not json" });
    const res = await contextsRoute.POST(req, { params: Promise.resolve({ siteId: fx.site.id }) });
    expect(res.status).toBe(400);
  });

  it("refuses an outline change that would leave a find outside the trench", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    await findAt(fx, 9, 5);
    const res = await shrinkTo5m(fx);
    expect(res.status).toBe(409);
    expect(res.json.error).toMatch(/leave 1 find outside/);
  });

  it("names who signed off a context whose finds an outline change would strand", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    await findAt(fx, 9, 5);
    const db = await getDb();
    await db
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffBy: fx.people.director.id, signedOffAt: new Date("2026-07-14T09:30:00Z") })
      .where(eq(schema.contexts.id, fx.context.id));
    const before = await db.select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id));
    const res = await shrinkTo5m(fx);
    expect(res.status).toBe(409);
    expect(res.json.error).toContain(
      `Context ${fx.context.number} was signed off by Director on 14 Jul 2026, 09:30 UTC`,
    );
    expect(await db.select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id))).toEqual(before);
  });
});

describe("a signed-off trench", () => {
  it("refuses outline edits naming who signed it off, and changes nothing", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db
      .update(schema.trenches)
      .set({ signedOffAt: new Date("2026-08-01T16:00:00Z"), signedOffBy: fx.people.director.id })
      .where(eq(schema.trenches.id, fx.trench.id));
    const [before] = await db.select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id));
    session.userId = fx.people.director.id;
    const res = await call(trenchRoute, "PATCH", { siteId: fx.site.id, trenchId: fx.trench.id }, { name: "Renamed" });
    expect(res.status).toBe(409);
    expect(res.json.error).toContain("Trench A was signed off by Director on 1 Aug 2026, 16:00 UTC");
    const [after] = await db.select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id));
    expect(after).toEqual(before);
  });
});

describe("OpenAPI document", () => {
  it("lists every catalogued route with its method", () => {
    const doc = buildOpenApiDocument();
    for (const op of Object.values(api)) {
      const item = doc.paths?.[op.path] as Record<string, unknown> | undefined;
      expect(item?.[op.method.toLowerCase()], `${op.method} ${op.path}`).toBeDefined();
    }
    expect(doc.openapi).toBe("3.1.0");
    expect(
      (doc.paths?.["/api/auth-extra/password-reset/request"] as { post?: { description?: string } }).post?.description,
    ).toMatch(/No sign-in/);
  });
});

describe("site grid settings", () => {
  it("accepts a projected proj4 definition or WKT and refuses longitude/latitude or nonsense, naming the field", async () => {
    const { makeSite } = await import("../support/fixtures");
    const siteRoute = await import("@/app/api/sites/[siteId]/route");
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    // British National Grid as proj4 writes it (EPSG:27700 definition, from memory of the EPSG registry entry).
    const bng =
      "+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +units=m +no_defs";
    const ok = await call(
      siteRoute,
      "PATCH",
      { siteId: fx.site.id },
      { crs: bng, gridOriginX: 451200, gridOriginY: 287350 },
    );
    expect(ok.status).toBe(200);
    expect(ok.json).toMatchObject({ crs: bng, gridOriginX: 451200 });
    // The same system as OGC WKT, the form a GeoPackage names it in: the demo site's own placement.
    const wkt = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { crs: DEMO_PLACEMENT.crs });
    expect(wkt.status).toBe(200);
    expect(wkt.json.crs).toBe(DEMO_PLACEMENT.crs);
    const wgs84Wkt =
      'GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563]],PRIMEM["Greenwich",0],UNIT["degree",0.0174532925199433],AUTHORITY["EPSG","4326"]]';
    for (const bad of ["+proj=longlat +datum=WGS84 +no_defs", "+proj=nothing-like-this", wgs84Wkt]) {
      const res = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { crs: bad });
      expect(res.status).toBe(400);
      expect(res.json.fieldErrors.crs[0]).toMatch(/Not a projected CRS in metres/);
    }
    const cleared = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { crs: "" });
    expect(cleared.json.crs).toBeNull();
  });
});

describe("run descriptions", () => {
  it("refuses a misspelt option of a new run with the key named, and starts nothing", async () => {
    const runsRoute = await import("@/app/api/sites/[siteId]/runs/route");
    const fx = await makeSite();
    session.userId = fx.people.specialist.id;
    const scope = { trenchId: fx.trench.id, contextIds: [fx.context.id], classIds: [fx.cls.id] };
    const cases: [unknown, string, RegExp][] = [
      [
        { scope, tests: [{ kind: "l-envelope" }], params: { corection: "border" } },
        "params",
        /"corection" is not a field Loamwork keeps here/,
      ],
      [
        { scope, tests: [{ kind: "l-envelope", statistc: "dclf" }] },
        "tests.0",
        /"statistc" is not a field Loamwork keeps here/,
      ],
      [
        { scope: { ...scope, contextId: fx.context.id }, tests: [{ kind: "l-envelope" }] },
        "scope",
        /"contextId" is not a field Loamwork keeps here/,
      ],
      [{ scope, tests: [{ kind: "l-envelope" }], lable: "typo" }, "_", /"lable" is not a field Loamwork keeps here/],
    ];
    for (const [body, field, message] of cases) {
      const res = await call(runsRoute, "POST", { siteId: fx.site.id }, body);
      expect(res.status, JSON.stringify(res.json)).toBe(400);
      expect(res.json.fieldErrors[field].join(" ")).toMatch(message);
    }
    const db = await getDb();
    expect(await db.select().from(schema.analysisRuns).where(eq(schema.analysisRuns.siteId, fx.site.id))).toHaveLength(
      0,
    );
  });
});
