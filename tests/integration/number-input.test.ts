import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import * as contextsRoute from "@/app/api/sites/[siteId]/contexts/route";
import * as siteRoute from "@/app/api/sites/[siteId]/route";
import { insertFind } from "./role-cases/core";

/** Values a number field once read as 1, 3, 3, 0 and 0 (z.coerce.number()). */
const loose: [string, unknown][] = [
  ["true", true],
  ["[3]", [3]],
  ['"0x3"', "0x3"],
  ["null", null],
  ['""', ""],
];

describe("a coordinate is a finite number or a plain decimal string, nothing else", () => {
  for (const [what, value] of loose) {
    it(`refuses x: ${what} when recording a find, naming x, and records nothing`, async () => {
      const fx = await makeSite();
      session.userId = fx.people.digger.id;
      const res = await call(
        findsRoute,
        "POST",
        { siteId: fx.site.id },
        { contextId: fx.context.id, classId: fx.cls.id, x: value, y: 1 },
      );
      expect(res.status).toBe(400);
      expect(Object.keys(res.json.fieldErrors)).toEqual(["x"]);
      const db = await getDb();
      expect(await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id))).toHaveLength(0);
    });

    it(`refuses x: ${what} when changing a find, and the find keeps its place`, async () => {
      const fx = await makeSite();
      const f = await insertFind(fx);
      session.userId = fx.people.director.id;
      const res = await call(findRoute, "PATCH", { siteId: fx.site.id, findId: f.id }, { x: value });
      expect(res.status).toBe(400);
      expect(Object.keys(res.json.fieldErrors)).toEqual(["x"]);
      const db = await getDb();
      const [row] = await db.select().from(schema.finds).where(eq(schema.finds.id, f.id));
      expect(row.x).toBe(1);
    });

    it(`refuses count, context number and grid origin given as ${what}`, async () => {
      const fx = await makeSite();
      session.userId = fx.people.director.id;
      const find = await call(
        findsRoute,
        "POST",
        { siteId: fx.site.id },
        { contextId: fx.context.id, classId: fx.cls.id, x: 1, y: 1, count: value },
      );
      // An empty count is "no count" on the form, so "" and null stay allowed there.
      if (value === "" || value === null) expect(find.status).toBe(201);
      else expect(Object.keys(find.json.fieldErrors ?? {})).toEqual(["count"]);
      const ctx = await call(
        contextsRoute,
        "POST",
        { siteId: fx.site.id },
        { trenchId: fx.trench.id, number: value, type: "fill" },
      );
      expect(ctx.status).toBe(400);
      expect(Object.keys(ctx.json.fieldErrors)).toEqual(["number"]);
      const site = await call(siteRoute, "PATCH", { siteId: fx.site.id }, { gridOriginX: value });
      expect(site.status).toBe(400);
      expect(Object.keys(site.json.fieldErrors)).toEqual(["gridOriginX"]);
    });
  }

  it("still reads a form's decimal string and a JSON number", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const res = await call(
      findsRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: fx.context.id, classId: fx.cls.id, x: " 2.25 ", y: 1.5, z: "", count: "3" },
    );
    expect(res.status).toBe(201);
    expect([res.json.x, res.json.y, res.json.z, res.json.count]).toEqual([2.25, 1.5, null, 3]);
  });
});
