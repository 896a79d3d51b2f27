import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as importRoute from "@/app/api/sites/[siteId]/import/route";
import * as previewRoute from "@/app/api/sites/[siteId]/import/preview/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import { MAX_FIND_NUMBER, findNumberSchema } from "@/lib/schemas/find";

const mapping = { number: "Pt", x: "E", y: "N", classCode: "Code", contextNumber: "Ctx" };
const file = (fx: SiteFixture, numbers: (number | string)[]) =>
  ["Pt,E,N,Code,Ctx", ...numbers.map((n, i) => `${n},${1 + i * 0.01},1.5,FL,${fx.context.number}`)].join("\n");

async function siteState(fx: SiteFixture) {
  const db = await getDb();
  const [site] = await db.select().from(schema.sites).where(eq(schema.sites.id, fx.site.id));
  const finds = await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id));
  return { next: site.nextFindNumber, numbers: finds.map((f) => f.number).sort((a, b) => a - b) };
}

async function setNext(fx: SiteFixture, next: number) {
  const db = await getDb();
  await db.update(schema.sites).set({ nextFindNumber: next }).where(eq(schema.sites.id, fx.site.id));
}

const newFind = (fx: SiteFixture) =>
  call(findsRoute, "POST", { siteId: fx.site.id }, { contextId: fx.context.id, classId: fx.cls.id, x: 2, y: 2 });

describe(`find numbers stop at ${MAX_FIND_NUMBER}`, () => {
  it("the schema's bound is 99,999,999 and it reads numbers strictly", () => {
    expect(MAX_FIND_NUMBER).toBe(99_999_999);
    expect(findNumberSchema.safeParse(99_999_999).success).toBe(true);
    expect(findNumberSchema.safeParse("100000000").success).toBe(false);
    expect(findNumberSchema.safeParse(0).success).toBe(false);
  });

  for (const n of [2147483646, 2147483647, 100_000_000, "99999999999999999999"]) {
    it(`an imported find number ${n} is refused in the row report, nothing imported, and numbering goes on`, async () => {
      const fx = await makeSite();
      session.userId = fx.people.digger.id;
      const csv = file(fx, [7, n]);
      const preview = await call(previewRoute, "POST", { siteId: fx.site.id }, { csv, fileName: "tps.csv", mapping });
      expect(preview.status).toBe(200);
      expect(preview.json.errors).toEqual([
        { row: 3, reasons: [`find number ${n} is above 99,999,999, the highest find number Loamwork keeps`] },
      ]);
      const refused = await call(importRoute, "POST", { siteId: fx.site.id }, { csv, fileName: "tps.csv", mapping });
      expect(refused.status).toBe(400);
      expect(refused.json.details.errors.map((e: { row: number }) => e.row)).toEqual([3]);
      expect(await siteState(fx)).toEqual({ next: 1, numbers: [] });
      const typed = await newFind(fx);
      expect(typed.status).toBe(201);
      expect(typed.json.number).toBe(1);
    });
  }

  it("the last number can be imported; after it a new find is refused with 409 saying the numbers are used up", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const done = await call(
      importRoute,
      "POST",
      { siteId: fx.site.id },
      { csv: file(fx, [MAX_FIND_NUMBER]), fileName: "last.csv", mapping },
    );
    expect(done.status).toBe(201);
    expect(await siteState(fx)).toEqual({ next: MAX_FIND_NUMBER + 1, numbers: [MAX_FIND_NUMBER] });
    const typed = await newFind(fx);
    expect(typed.status).toBe(409);
    expect(typed.json.error).toBe(
      "This site's find numbers are used up: find numbers go up to 99,999,999, and none is left for a new find.",
    );
    expect(await siteState(fx)).toEqual({ next: MAX_FIND_NUMBER + 1, numbers: [MAX_FIND_NUMBER] });
  });

  it("rows without a number that would pass the bound are named in the row report", async () => {
    const fx = await makeSite();
    await setNext(fx, MAX_FIND_NUMBER - 1);
    session.userId = fx.people.digger.id;
    // Rows 2 and 3 get 99,999,998 and 99,999,999; row 4 would get 100,000,000.
    const csv = file(fx, ["", "", ""]);
    const refused = await call(importRoute, "POST", { siteId: fx.site.id }, { csv, fileName: "three.csv", mapping });
    expect(refused.status).toBe(400);
    expect(refused.json.details.errors).toEqual([
      { row: 4, reasons: ["no find number is left for this row: this site's find numbers go up to 99,999,999"] },
    ]);
    expect(await siteState(fx)).toEqual({ next: MAX_FIND_NUMBER - 1, numbers: [] });
    const two = await call(
      importRoute,
      "POST",
      { siteId: fx.site.id },
      { csv: file(fx, ["", ""]), fileName: "two.csv", mapping },
    );
    expect(two.status).toBe(201);
    expect([two.json.firstNumber, two.json.lastNumber]).toEqual([MAX_FIND_NUMBER - 1, MAX_FIND_NUMBER]);
  });

  it("an imported count beyond a find's form bound is refused by row, not stored past its column", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const csv = ["Pt,E,N,Code,Ctx,Qty", `1,1.5,1.5,FL,${fx.context.number},3000000000`].join("\n");
    const res = await call(
      importRoute,
      "POST",
      { siteId: fx.site.id },
      { csv, fileName: "qty.csv", mapping: { ...mapping, count: "Qty" } },
    );
    expect(res.status).toBe(400);
    expect(res.json.details.errors).toEqual([
      { row: 2, reasons: ['count "3000000000": A count is at most 1,000,000.'] },
    ]);
  });

  it("a site whose counter was pushed past the bound before it existed is refused cleanly, never 500", async () => {
    const fx = await makeSite();
    // What importing 2147483646 used to leave behind: the counter at the top of a 32-bit integer.
    await setNext(fx, 2147483647);
    session.userId = fx.people.digger.id;
    const typed = await newFind(fx);
    expect(typed.status).toBe(409);
    expect(typed.json.error).toContain("find numbers are used up");
    const imported = await call(
      importRoute,
      "POST",
      { siteId: fx.site.id },
      { csv: file(fx, [""]), fileName: "one.csv", mapping },
    );
    expect(imported.status).toBe(400);
    expect(imported.json.details.errors[0].row).toBe(2);
  });
});
