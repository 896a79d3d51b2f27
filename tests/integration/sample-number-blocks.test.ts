import { describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { call, session } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import * as siteRoute from "@/app/api/sites/[siteId]/route";
import * as samplesRoute from "@/app/api/sites/[siteId]/samples/route";
import * as sampleRoute from "@/app/api/sites/[siteId]/samples/[sampleId]/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as blocksRoute from "@/app/api/sites/[siteId]/number-blocks/route";
import * as accountingRoute from "@/app/api/sites/[siteId]/number-accounting/route";
import * as importRoute from "@/app/api/sites/[siteId]/import/route";

/**
 * Where a site's samples share the finds' sequence, a sample's number is handed out like a find's: never
 * inside a block a device holds for recording offline, and, once the sample is deleted, void in the
 * accounting (it was handed out), never "not handed out" and never handed out again.
 */
const bulk = (contextId: string) => ({ contextId, type: "bulk" as const, purpose: "flotation", volumeL: 40 });

async function sharedSite(): Promise<SiteFixture> {
  const fx = await makeSite();
  session.userId = fx.people.director.id;
  const set = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { samplesShareFindNumbers: true });
  expect(set.status, JSON.stringify(set.json)).toBe(200);
  return fx;
}

type Range = { first: number; last: number; status: string; reason?: string };
const accounting = async (fx: SiteFixture) =>
  (await call(accountingRoute, "GET", { siteId: fx.site.id }, undefined, { kind: "find" })).json as {
    ranges: Range[];
    overlaps: number[];
  };

describe("samples sharing the finds' numbers, beside number blocks", () => {
  it("a sample is numbered past the block a device holds, and the block keeps all its numbers", async () => {
    const fx = await sharedSite();
    session.userId = fx.people.digger.id;
    const block = await call(
      blocksRoute,
      "POST",
      { siteId: fx.site.id },
      { kind: "find", deviceId: randomUUID(), deviceLabel: "Tablet 1" },
    );
    expect([block.json.first, block.json.last]).toEqual([1, 50]);
    const sample = await call(samplesRoute, "POST", { siteId: fx.site.id }, bulk(fx.context.id));
    expect(sample.status, JSON.stringify(sample.json)).toBe(201);
    expect(sample.json.number).toBe(51);
    const find = await call(
      findsRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: fx.context.id, classId: fx.cls.id, x: 1, y: 1 },
    );
    expect(find.json.number).toBe(52);
    const held = await call(blocksRoute, "GET", { siteId: fx.site.id });
    expect(held.json[0].left).toBe(50);
    const a = await accounting(fx);
    expect(a.overlaps).toEqual([]);
    expect(a.ranges.map((r) => [r.first, r.last, r.status])).toEqual([
      [1, 50, "reserved"],
      [51, 51, "sample"],
      [52, 52, "find"],
    ]);
  });

  it("a deleted sample's number is void with the reason, and an import cannot bring it back", async () => {
    const fx = await sharedSite();
    session.userId = fx.people.digger.id;
    const sample = await call(samplesRoute, "POST", { siteId: fx.site.id }, bulk(fx.context.id));
    expect(sample.json.number).toBe(1);
    const del = await call(
      sampleRoute,
      "DELETE",
      { siteId: fx.site.id, sampleId: sample.json.id },
      { reason: "bagged twice" },
    );
    expect(del.status, JSON.stringify(del.json)).toBe(200);
    const a = await accounting(fx);
    expect(a.ranges).toEqual([
      expect.objectContaining({ first: 1, last: 1, status: "void", reason: "sample deleted: bagged twice" }),
    ]);
    const csv = ["Pt,E,N,Code,Ctx", `1,1,1,FL,${fx.context.number}`].join("\n");
    const mapping = { number: "Pt", x: "E", y: "N", classCode: "Code", contextNumber: "Ctx" };
    const refused = await call(importRoute, "POST", { siteId: fx.site.id }, { csv, fileName: "s.csv", mapping });
    expect(refused.status).toBe(400);
    expect(refused.json.details.errors).toEqual([
      {
        row: 2,
        reasons: [
          "find number 1 is void (sample deleted: bagged twice) and is never used again; leave it blank to get a new one",
        ],
      },
    ]);
  });
});
