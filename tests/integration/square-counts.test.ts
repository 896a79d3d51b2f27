import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { gridTrench, makeSquareRecord } from "./role-cases/squares";
import * as squaresRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/squares/route";
import * as squareRecordRoute from "@/app/api/sites/[siteId]/square-records/[sampleId]/route";
import * as squareImportRoute from "@/app/api/sites/[siteId]/square-import/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";
import * as spitsRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/spits/route";
import { contextFingerprint, trenchFingerprint } from "@/lib/server/sign-off";

const site = (fx: SiteFixture) => ({ siteId: fx.site.id });
const trench = (fx: SiteFixture) => ({ siteId: fx.site.id, trenchId: fx.trench.id });

async function readSquares(fx: SiteFixture) {
  session.userId = fx.people.specialist.id;
  const res = await call(squaresRoute, "GET", trench(fx));
  expect(res.status).toBe(200);
  return res.json;
}

async function tableCounts() {
  const db = await getDb();
  return [
    (await db.select().from(schema.squareSamples)).length,
    (await db.select().from(schema.squareCounts)).length,
    (await db.select().from(schema.auditEntries)).length,
  ];
}

describe("the square grid of a trench", () => {
  it("is set by a director through the trench, and its squares come clipped to the outline and baulk", async () => {
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    const res = await call(trenchRoute, "PATCH", trench(fx), { squareSize: 1, squareOriginX: 0, squareOriginY: 0 });
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    const view = await readSquares(fx);
    expect(view.grid).toEqual({ size: 1, originX: 0, originY: 0 });
    // 10 m × 6 m less the 2 m × 1 m baulk: 58 squares of 1 m².
    expect(view.squares).toHaveLength(58);
  });

  it("may not be set by a digger (field rights), and a grid too fine is refused on its field", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const refused = await call(trenchRoute, "PATCH", trench(fx), { squareSize: 1 });
    expect(refused.status).toBe(403);
    expect(refused.json.fieldErrors.squareSize).toBeDefined();
    session.userId = fx.people.director.id;
    const fine = await call(trenchRoute, "PATCH", trench(fx), { squareSize: 0.1, squareOriginX: 0, squareOriginY: 0 });
    expect(fine.status).toBe(200); // 100 × 60 = 6,000 squares: allowed
    const db = await getDb();
    await db.update(schema.trenches).set({ squareSize: null }).where(eq(schema.trenches.id, fx.trench.id));
    const outline = {
      type: "Polygon",
      coordinates: [
        [
          [0, 0],
          [300, 0],
          [300, 100],
          [0, 100],
          [0, 0],
        ],
      ],
    };
    const tooMany = await call(trenchRoute, "PATCH", trench(fx), { outline, squareSize: 0.5 });
    expect(tooMany.status).toBe(400);
    expect(tooMany.json.fieldErrors.squareSize[0]).toContain("120,000 squares");
  });

  it("refuses a grid that leaves no square inside the trench, on its field, writing nothing", async () => {
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    // A sliver of a trench (5e-11 m²): no 1 m square keeps more than a rounding error of it.
    const sliver = {
      type: "Polygon",
      coordinates: [
        [
          [0, 0],
          [1e-5, 0],
          [0, 1e-5],
          [0, 0],
        ],
      ],
    };
    const db = await getDb();
    await db
      .update(schema.trenches)
      .set({ outline: sliver as schema.Trench["outline"] })
      .where(eq(schema.trenches.id, fx.trench.id));
    const before = await tableCounts();
    const res = await call(trenchRoute, "PATCH", trench(fx), { squareSize: 1, squareOriginX: 0, squareOriginY: 0 });
    expect(res.status, JSON.stringify(res.json)).toBe(400);
    expect(res.json.fieldErrors.squareSize).toEqual(["This grid leaves no square inside the trench."]);
    expect(await tableCounts()).toEqual(before);
    const [t] = await db.select().from(schema.trenches).where(eq(schema.trenches.id, fx.trench.id));
    expect(t!.squareSize).toBeNull();
  });

  it("cannot change under recorded counts, but a redrawn outline clips the squares again and keeps the counts", async () => {
    const fx = await makeSite();
    await makeSquareRecord(fx, 9, 5, 11);
    session.userId = fx.people.director.id;
    const moved = await call(trenchRoute, "PATCH", trench(fx), { squareOriginX: 0.5 });
    expect(moved.status).toBe(409);
    expect(moved.json.error).toContain("grid cannot change under them");
    // Shrink the trench to 9.5 m: square 9/5 keeps half its area, counts unchanged.
    const outline = {
      type: "Polygon",
      coordinates: [
        [
          [0, 0],
          [9.5, 0],
          [9.5, 6],
          [0, 6],
          [0, 0],
        ],
      ],
    };
    expect((await call(trenchRoute, "PATCH", trench(fx), { outline })).status).toBe(200);
    let view = await readSquares(fx);
    expect(view.samples).toHaveLength(1);
    expect(view.samples[0]).toMatchObject({
      label: "9/5",
      area: 0.5,
      outside: false,
      counts: [{ classId: fx.cls.id, count: 11, weightG: null }],
    });
    // Shrink past it: the record is kept, marked outside, with no area.
    session.userId = fx.people.director.id;
    const smaller = {
      type: "Polygon",
      coordinates: [
        [
          [0, 0],
          [8, 0],
          [8, 6],
          [0, 6],
          [0, 0],
        ],
      ],
    };
    expect((await call(trenchRoute, "PATCH", trench(fx), { outline: smaller })).status).toBe(200);
    view = await readSquares(fx);
    expect(view.samples[0]).toMatchObject({ label: "9/5", area: 0, outside: true });
  });
});

describe("recording counts by square", () => {
  it("records a square with counts per class (0 kept as a count) and replaces them on a second entry, audited", async () => {
    const fx = await makeSite();
    await gridTrench(fx);
    const db = await getDb();
    const [other] = await db
      .insert(schema.artefactClasses)
      .values({ siteId: fx.site.id, code: "BB", label: "Burnt bone", colour: "#e69f00", symbol: "circle" })
      .returning();
    session.userId = fx.people.digger.id;
    const body = {
      col: 2,
      row: 4,
      contextId: fx.context.id,
      excavatedArea: 0.75,
      counts: [
        { classId: fx.cls.id, count: 14, weightG: 21.5 },
        { classId: other!.id, count: 0 },
      ],
    };
    const first = await call(squaresRoute, "POST", trench(fx), body);
    expect(first.status, JSON.stringify(first.json)).toBe(200);
    const again = await call(squaresRoute, "POST", trench(fx), {
      ...body,
      excavatedArea: null,
      counts: [{ classId: fx.cls.id, count: 15 }],
    });
    expect(again.status).toBe(200);
    expect(again.json.id).toBe(first.json.id);
    const view = await readSquares(fx);
    expect(view.samples).toHaveLength(1);
    expect(view.samples[0]).toMatchObject({
      label: "2/4",
      excavatedArea: null,
      area: 1,
      counts: [{ classId: fx.cls.id, count: 15, weightG: null }],
    });
    const trail = await db.select().from(schema.auditEntries).where(eq(schema.auditEntries.recordId, first.json.id));
    expect(trail.map((a) => a.action)).toEqual(["create", "update"]);
    expect((trail[1]!.before as { counts: { count: number }[] }).counts.map((c) => c.count).sort()).toEqual([0, 14]);
  });

  it("keeps one record per square, context and spit", async () => {
    const fx = await makeSite();
    await gridTrench(fx);
    session.userId = fx.people.digger.id;
    const spit = await call(spitsRoute, "POST", { siteId: fx.site.id, contextId: fx.context.id }, { number: 1 });
    const base = { col: 0, row: 0, contextId: fx.context.id, counts: [{ classId: fx.cls.id, count: 2 }] };
    expect((await call(squaresRoute, "POST", trench(fx), base)).status).toBe(200);
    expect((await call(squaresRoute, "POST", trench(fx), { ...base, spitId: spit.json.id })).status).toBe(200);
    const view = await readSquares(fx);
    expect(view.samples.map((s: { spitNumber: number | null }) => s.spitNumber)).toEqual([1, null].sort());
  });

  it.each([
    ["a square outside the trench", { col: 12, row: 0 }, "col", "lies outside trench A"],
    ["a square under the baulk", { col: 4, row: 2 }, "col", "Square 4/2 lies outside trench A"],
    ["a negative count", { counts: "negative" }, "counts.0.count", "cannot be negative"],
    ["a class unknown to the site", { counts: "unknown" }, "counts.0.classId", "not one of this site's classes"],
    ["more area than the square has", { excavatedArea: 1.5 }, "excavatedArea", "cannot have been dug there"],
    ["an excavated area of 0", { excavatedArea: 0 }, "excavatedArea", "more than 0 m²"],
  ])("refuses %s, naming the field, writing nothing", async (_what, change, field, message) => {
    const fx = await makeSite();
    await gridTrench(fx);
    const kind = (change as { counts?: string }).counts;
    const counts =
      kind === "negative"
        ? [{ classId: fx.cls.id, count: -1 }]
        : kind === "unknown"
          ? [{ classId: crypto.randomUUID(), count: 1 }]
          : [{ classId: fx.cls.id, count: 1 }];
    const body = { col: 1, row: 1, contextId: fx.context.id, ...change, counts };
    const before = await tableCounts();
    session.userId = fx.people.digger.id;
    const res = await call(squaresRoute, "POST", trench(fx), body);
    expect(res.status).toBe(400);
    expect(res.json.fieldErrors[field], JSON.stringify(res.json)).toBeDefined();
    expect(res.json.error + JSON.stringify(res.json.fieldErrors)).toContain(message);
    expect(await tableCounts()).toEqual(before);
  });

  it("refuses counts in a trench with no grid yet", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const res = await call(squaresRoute, "POST", trench(fx), {
      col: 1,
      row: 1,
      contextId: fx.context.id,
      counts: [{ classId: fx.cls.id, count: 1 }],
    });
    expect(res.status).toBe(409);
    expect(res.json.error).toContain("has no square grid yet");
  });

  it("deletes a record: the square is not excavated there any more", async () => {
    const fx = await makeSite();
    const s = await makeSquareRecord(fx);
    session.userId = fx.people.digger.id;
    expect((await call(squareRecordRoute, "DELETE", { siteId: fx.site.id, sampleId: s.id })).status).toBe(200);
    expect((await readSquares(fx)).samples).toEqual([]);
  });
});

describe("counts by square in what is signed off", () => {
  it("a square count changes the context's and the trench's fingerprints", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const before = [await contextFingerprint(db, fx.context), await trenchFingerprint(db, fx.trench)];
    const s = await makeSquareRecord(fx, 1, 1, 5);
    const during = [await contextFingerprint(db, fx.context), await trenchFingerprint(db, fx.trench)];
    expect(during[0]).not.toBe(before[0]);
    expect(during[1]).not.toBe(before[1]);
    await db.update(schema.squareCounts).set({ count: 6 }).where(eq(schema.squareCounts.sampleId, s.id));
    expect(await contextFingerprint(db, fx.context)).not.toBe(during[0]);
    // No records, the fingerprint it had before squares existed.
    await db.delete(schema.squareSamples).where(eq(schema.squareSamples.id, s.id));
    expect(await contextFingerprint(db, fx.context)).toBe(before[0]);
  });
});

describe("importing counts by square", () => {
  const header = "square,context,spit,class,count,weight_g,excavated_m2";
  async function importCsv(fx: SiteFixture, csv: string, dryRun = false) {
    session.userId = fx.people.digger.id;
    return call(squareImportRoute, "POST", site(fx), { trenchId: fx.trench.id, csv, fileName: "sieve.csv", dryRun });
  }

  it("imports every row, grouping rows of one square, context and spit into one record", async () => {
    const fx = await makeSite();
    await gridTrench(fx);
    const db = await getDb();
    await db.insert(schema.spits).values({ siteId: fx.site.id, contextId: fx.context.id, number: 2 });
    await db
      .insert(schema.artefactClasses)
      .values({ siteId: fx.site.id, code: "BB", label: "Burnt bone", colour: "#e69f00", symbol: "circle" });
    const n = fx.context.number;
    const csv = [
      header,
      `0/0,${n},2,FL,12,40.2,0.5`,
      `0/0,${n},2,bb,0,,0.5`,
      `1/0,${n},,FL,3,,`,
      `1,0,${n},,BB,"1,5",,`,
    ]
      .join("\n")
      .replace("1,0,", '"1,0",');
    const dry = await importCsv(fx, csv, true);
    expect(dry.status, JSON.stringify(dry.json)).toBe(200);
    expect(dry.json).toMatchObject({ dryRun: true, rowCount: 4, squares: 2 });
    expect(dry.json.errors).toEqual([{ row: 5, reasons: ['count "1,5": A count is a whole number.'] }]);
    expect(
      (await db.select().from(schema.squareSamples).where(eq(schema.squareSamples.trenchId, fx.trench.id))).length,
    ).toBe(0);
    const fixed = csv.replace('"1,5"', "1");
    const res = await importCsv(fx, fixed);
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    expect(res.json).toMatchObject({ dryRun: false, rowCount: 4, squares: 2, errors: [] });
    const view = await readSquares(fx);
    const byLabel = Object.fromEntries(view.samples.map((s: { label: string }) => [s.label, s]));
    expect(byLabel["0/0"]).toMatchObject({ spitNumber: 2, excavatedArea: 0.5, area: 0.5 });
    expect(byLabel["0/0"].counts).toHaveLength(2);
    expect(byLabel["1/0"]).toMatchObject({ spitNumber: null, excavatedArea: null, area: 1 });
    expect(byLabel["1/0"].counts.map((c: { count: number }) => c.count).sort()).toEqual([1, 3]);
  });

  it("refuses the whole file with a row report: outside squares, negative counts, unknown classes, bad spits", async () => {
    const fx = await makeSite();
    await gridTrench(fx);
    const n = fx.context.number;
    const csv = [
      header,
      `0/0,${n},,FL,2,,`,
      `12/0,${n},,FL,2,,`,
      `4/2,${n},,FL,2,,`,
      `1/1,${n},,FL,-3,,`,
      `1/1,${n},,XX,3,,`,
      `1/1,${n},7,FL,3,,`,
      `1.5/1,${n},,FL,3,,`,
      `2/2,${n},,FL,,,`,
      `2/3,${n},,FL,1,,1.2`,
      `0/0,${n},,FL,5,,`,
    ].join("\n");
    const before = await tableCounts();
    const res = await importCsv(fx, csv);
    expect(res.status).toBe(400);
    expect(res.json.error).toBe(
      "9 of 10 rows cannot be imported, so nothing was imported. Fix them and upload the file again.",
    );
    const reasons = Object.fromEntries(
      res.json.details.errors.map((e: { row: number; reasons: string[] }) => [e.row, e.reasons.join("; ")]),
    );
    expect(reasons).toEqual({
      3: "square 12/0 lies outside trench A",
      4: "square 4/2 lies outside trench A",
      5: 'count "-3": A count cannot be negative.',
      6: 'class "XX" is not one of this site\'s classes',
      7: `spit "7" is not a spit of context ${n}`,
      8: 'square "1.5/1" is not the south-west corner of a 1 m square of this grid (easting/northing, e.g. 0/0)',
      9: "count is empty (enter 0 when none were found)",
      10: "excavated area 1.2 m² is more than the 1 m² of square 2/3 inside the trench",
      11: `class FL in square 0/0, context ${n} is also on row 2`,
    });
    expect(await tableCounts()).toEqual(before);
  });

  it("names a missing column and a trench with no grid", async () => {
    const fx = await makeSite();
    const noGrid = await importCsv(fx, `${header}\n0/0,${fx.context.number},,FL,1,,`);
    expect(noGrid.status).toBe(409);
    expect(noGrid.json.error).toContain("has no square grid yet");
    await gridTrench(fx);
    const noCount = await importCsv(fx, `square,context,class\n0/0,${fx.context.number},FL`);
    expect(noCount.status).toBe(400);
    expect(noCount.json.error).toContain("The file has no count column");
  });
});
