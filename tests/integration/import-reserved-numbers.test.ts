import { describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { call, session } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as importRoute from "@/app/api/sites/[siteId]/import/route";
import * as previewRoute from "@/app/api/sites/[siteId]/import/preview/route";
import * as blocksRoute from "@/app/api/sites/[siteId]/number-blocks/route";
import * as releaseRoute from "@/app/api/sites/[siteId]/number-blocks/[blockId]/release/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";

/**
 * A total-station file may bring its own find numbers, but never one a device holds in a block for
 * recording offline (it may already be written on a bag), nor a void number: that row is refused with a
 * sentence saying whose or why, and nothing of the file is imported. Rows without a number are numbered
 * past every block.
 */
const mapping = { number: "Pt", x: "E", y: "N", z: "H", classCode: "Code", contextNumber: "Ctx" };

const findsOf = async (siteId: string) =>
  (await (await getDb()).select().from(schema.finds).where(eq(schema.finds.siteId, siteId))).sort(
    (a, b) => a.number - b.number,
  );

const reserve = async (fx: SiteFixture, deviceLabel: string) => {
  const res = await call(
    blocksRoute,
    "POST",
    { siteId: fx.site.id },
    { kind: "find", deviceId: randomUUID(), deviceLabel },
  );
  expect(res.status, JSON.stringify(res.json)).toBe(201);
  return res.json as { id: string; first: number; last: number };
};

const file = (fx: SiteFixture, numbers: (number | "")[]) =>
  ["Pt,E,N,H,Code,Ctx", ...numbers.map((n, i) => `${n},${1 + i * 0.5},1.5,,FL,${fx.context.number}`)].join("\n");

describe("imports and reserved find numbers", () => {
  it("refuses a row naming a number in another device's block, or a void number, and imports nothing", async () => {
    const fx = await makeSite();
    // The digger's tablet holds 1–50; a find recorded online then takes 51 and is deleted (51 is void);
    // the tablet is lost and gives back its block, 1–50 void; a second tablet holds 52–101.
    session.userId = fx.people.digger.id;
    const lost = await reserve(fx, "Tablet 1");
    expect([lost.first, lost.last]).toEqual([1, 50]);
    const made = await call(
      findsRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: fx.context.id, classId: fx.cls.id, x: 1, y: 1 },
    );
    expect(made.json.number).toBe(51);
    expect((await call(findRoute, "DELETE", { siteId: fx.site.id, findId: made.json.id })).status).toBe(200);
    expect(
      (await call(releaseRoute, "POST", { siteId: fx.site.id, blockId: lost.id }, { reason: "tablet lost" })).status,
    ).toBe(200);
    const held = await reserve(fx, "Tablet 2");
    expect([held.first, held.last]).toEqual([52, 101]);

    // The director imports a file naming 60 (held by Tablet 2), 51 (void: deleted) and 7 (void: given back).
    session.userId = fx.people.director.id;
    const csv = file(fx, [60, 51, 7, ""]);
    const preview = await call(previewRoute, "POST", { siteId: fx.site.id }, { csv, fileName: "day2.csv", mapping });
    expect(preview.status).toBe(200);
    expect(preview.json.validCount).toBe(1);
    const digger = fx.people.digger.name;
    const expected = [
      {
        row: 2,
        reasons: [
          `find number 60 is reserved for ${digger} on Tablet 2 (block 52–101, for recording offline; it may already be on a bag); leave it blank to get a new one`,
        ],
      },
      {
        row: 3,
        reasons: ["find number 51 is void (find deleted) and is never used again; leave it blank to get a new one"],
      },
      {
        row: 4,
        reasons: [
          "find number 7 is void (Block given back: tablet lost) and is never used again; leave it blank to get a new one",
        ],
      },
    ];
    expect(preview.json.errors).toEqual(expected);
    const refused = await call(importRoute, "POST", { siteId: fx.site.id }, { csv, fileName: "day2.csv", mapping });
    expect(refused.status).toBe(400);
    expect(refused.json.error).toContain("3 of 4 rows cannot be imported, so nothing was imported");
    expect(refused.json.details.errors).toEqual(expected);
    expect(await findsOf(fx.site.id)).toHaveLength(0);
  });

  it("numbers rows without a number past every block, and keeps a file number past them", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const held = await reserve(fx, "Tablet 1");
    expect([held.first, held.last]).toEqual([1, 50]);
    const done = await call(
      importRoute,
      "POST",
      { siteId: fx.site.id },
      { csv: file(fx, ["", 120, ""]), fileName: "day3.csv", mapping },
    );
    expect(done.status, JSON.stringify(done.json)).toBe(201);
    expect((await findsOf(fx.site.id)).map((f) => f.number)).toEqual([120, 121, 122]);
    // The block is untouched: its 50 numbers are still the tablet's.
    const list = await call(blocksRoute, "GET", { siteId: fx.site.id });
    expect(list.json.find((b: { id: string }) => b.id === held.id).left).toBe(50);
  });
});
