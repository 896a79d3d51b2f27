import { describe, expect, it } from "vitest";
import { session, call } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import * as exportFindsRoute from "@/app/api/sites/[siteId]/export/finds/route";
import { and, eq } from "drizzle-orm";

/** 30 finds: numbers 1..30, class BB on every third, context B on even numbers, Specialist recorded 1..10 on 1 Nov. */
async function register() {
  const fx = await makeSite();
  const db = await getDb();
  const [bone] = await db
    .insert(schema.artefactClasses)
    .values({ siteId: fx.site.id, code: "BB", label: "Burnt bone", colour: "#cc79a7", symbol: "cross" })
    .returning();
  const [ctxB] = await db
    .insert(schema.contexts)
    .values({ siteId: fx.site.id, trenchId: fx.trench.id, number: 9001, type: "fill" })
    .returning();
  await db.insert(schema.finds).values(
    Array.from({ length: 30 }, (_, i) => {
      const n = i + 1;
      return {
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        contextId: n % 2 === 0 ? ctxB.id : fx.context.id,
        classId: n % 3 === 0 ? bone.id : fx.cls.id,
        number: n,
        x: (n * 0.3) % 9.5,
        y: 1 + (n % 5) * 0.9,
        method: "typed" as const,
        description: n === 17 ? "refitting flake near the hearth" : "",
        recordedBy: n <= 10 ? fx.people.specialist.id : fx.people.digger.id,
        recordedAt: new Date(n <= 10 ? "2026-11-01T10:00:00Z" : "2026-11-15T10:00:00Z"),
      };
    }),
  );
  return { fx, bone, ctxB };
}

describe("finds register", () => {
  it("filters by context, class, recorder, date range and text; sorts and pages in the database", async () => {
    const { fx, bone, ctxB } = await register();
    session.userId = fx.people.digger.id;
    const q = (query: Record<string, string>) =>
      call(findsRoute, "GET", { siteId: fx.site.id }, undefined, query).then((r) => r.json);
    const nums = (page: any) => page.rows.map((r: any) => r.number);
    // Expected sets follow from the fixture's rules above.
    expect(nums(await q({ classId: bone.id, contextId: ctxB.id }))).toEqual([6, 12, 18, 24, 30]);
    expect(nums(await q({ recordedBy: fx.people.specialist.id, classId: bone.id }))).toEqual([3, 6, 9]);
    expect((await q({ from: "2026-11-10", to: "2026-11-15" })).total).toBe(20);
    expect((await q({ to: "2026-11-01" })).total).toBe(10);
    expect(nums(await q({ q: "hearth" }))).toEqual([17]);
    expect(nums(await q({ q: "17" }))).toEqual([17]);
    const page2 = await q({ sort: "number", dir: "desc", page: "2", pageSize: "7" });
    expect(page2.total).toBe(30);
    expect(nums(page2)).toEqual([23, 22, 21, 20, 19, 18, 17]);
    const byClass = await q({ sort: "class", dir: "asc", pageSize: "10" });
    expect(byClass.rows.map((r: any) => r.classCode)).toEqual(Array(10).fill("BB"));
    expect(nums(byClass)).toEqual([3, 6, 9, 12, 15, 18, 21, 24, 27, 30]);
    const byContext = await q({ sort: "context", dir: "desc", pageSize: "3" });
    expect(byContext.rows.map((r: any) => r.contextNumber)).toEqual([9001, 9001, 9001]);
    // The fixture's people are named "Digger" and "Specialist": alphabetical order puts the digger's finds first.
    expect(nums(await q({ sort: "recorder", dir: "asc", pageSize: "3" }))).toEqual([11, 12, 13]);
    expect(nums(await q({ sort: "recorder", dir: "desc", pageSize: "3" }))).toEqual([1, 2, 3]);
    expect((await q({ sort: "trench", pageSize: "2" })).rows.map((r: any) => r.trenchCode)).toEqual(["A", "A"]);
    expect((await call(findsRoute, "GET", { siteId: fx.site.id }, undefined, { sort: "colour" })).status).toBe(400);
  });

  it("exports what the register shows: the same filters, in the same order", async () => {
    const { fx, bone } = await register();
    session.userId = fx.people.specialist.id;
    const res = await exportFindsRoute.GET(
      new Request(`http://localhost/x?format=csv&classId=${bone.id}&sort=number&dir=desc`),
      { params: Promise.resolve({ siteId: fx.site.id }) },
    );
    const lines = (await res.text()).trim().split("\r\n");
    expect(lines.slice(1).map((l) => Number(l.split(",")[0]))).toEqual([30, 27, 24, 21, 18, 15, 12, 9, 6, 3]);
  });

  it("refuses to edit a find of a signed-off context, saying who signed it off", async () => {
    const { fx } = await register();
    const db = await getDb();
    const [f] = await db
      .select()
      .from(schema.finds)
      .where(and(eq(schema.finds.siteId, fx.site.id), eq(schema.finds.number, 1)));
    await db
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffAt: new Date("2026-11-30T16:00:00Z"), signedOffBy: fx.people.director.id })
      .where(eq(schema.contexts.id, fx.context.id));
    session.userId = fx.people.specialist.id;
    const res = await call(findRoute, "PATCH", { siteId: fx.site.id, findId: f.id }, { classId: fx.cls.id });
    expect(res.status).toBe(409);
    expect(res.json.error).toContain("signed off by Director on 30 Nov 2026, 16:00 UTC");
  });
});
