import { describe, expect, it } from "vitest";
import { and, eq, inArray } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as bulkRoute from "@/app/api/sites/[siteId]/finds/bulk/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import { moveTargets } from "@/lib/server/finds-bulk";

async function find(fx: SiteFixture, number: number, contextId = fx.context.id, x = 1, y = 1) {
  const db = await getDb();
  const [f] = await db
    .insert(schema.finds)
    .values({ siteId: fx.site.id, trenchId: fx.trench.id, contextId, classId: fx.cls.id, number, x, y, method: "plan" })
    .returning();
  return f!;
}
async function context(
  fx: SiteFixture,
  number: number,
  trenchId = fx.trench.id,
  state: "open" | "signed_off" = "open",
) {
  const db = await getDb();
  const [c] = await db
    .insert(schema.contexts)
    .values({
      siteId: fx.site.id,
      trenchId,
      number,
      type: "fill",
      state,
      signedOffBy: state === "signed_off" ? fx.people.director.id : null,
      signedOffAt: state === "signed_off" ? new Date("2026-07-14T09:30:00Z") : null,
    })
    .returning();
  return c!;
}
const rows = async (ids: string[]) => (await getDb()).select().from(schema.finds).where(inArray(schema.finds.id, ids));

describe("bulk edits of finds: all or nothing", () => {
  it("refuses the whole move when one find is locked, naming it and why; nothing moves", async () => {
    const fx = await makeSite();
    const locked = await context(fx, 8801, fx.trench.id, "signed_off");
    const target = await context(fx, 8802);
    const picked = [await find(fx, 1), await find(fx, 2, locked.id), await find(fx, 3)];
    const before = await rows(picked.map((f) => f.id));
    session.userId = fx.people.digger.id;
    const res = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "move", findIds: picked.map((f) => f.id), contextId: target.id },
    );
    expect(res.status).toBe(409);
    expect(res.json.error).toContain(
      "No find was moved: 1 find stops it. find 2: Context 8801 was signed off by Director on 14 Jul 2026, 09:30 UTC",
    );
    expect(res.json.details.refused.map((r: { number: number }) => r.number)).toEqual([2]);
    expect(await rows(picked.map((f) => f.id))).toEqual(before);
  });

  it("refuses a move that would leave finds outside the target's trench, with each distance", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [small] = await db
      .insert(schema.trenches)
      .values({
        siteId: fx.site.id,
        code: "B",
        outline: {
          type: "Polygon",
          coordinates: [
            [
              [0, 0],
              [2, 0],
              [2, 2],
              [0, 2],
              [0, 0],
            ],
          ],
        },
      })
      .returning();
    const target = await context(fx, 8803, small!.id);
    const picked = [
      await find(fx, 11, fx.context.id, 1, 1),
      await find(fx, 12, fx.context.id, 5, 1),
      await find(fx, 13, fx.context.id, 1, 4),
    ];
    session.userId = fx.people.director.id;
    const res = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "move", findIds: picked.map((f) => f.id), contextId: target.id },
    );
    expect(res.status).toBe(409);
    expect(res.json.error).toContain(
      "find 12: it lies 3.000 m outside trench B, where context 8803 is · find 13: it lies 2.000 m outside trench B",
    );
    expect((await rows(picked.map((f) => f.id))).every((f) => f.contextId === fx.context.id)).toBe(true);
  });

  it("moves, re-classes and deletes every find picked, one audit entry each; a deletion keeps its reason", async () => {
    const fx = await makeSite();
    const target = await context(fx, 8804);
    const picked = [await find(fx, 21), await find(fx, 22), await find(fx, 23)];
    const ids = picked.map((f) => f.id);
    session.userId = fx.people.digger.id;
    const moved = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "move", findIds: ids, contextId: target.id },
    );
    expect(moved.json).toEqual({ action: "move", changed: 3, numbers: [21, 22, 23] });
    expect((await rows(ids)).every((f) => f.contextId === target.id)).toBe(true);
    const db = await getDb();
    const [cls] = await db
      .insert(schema.artefactClasses)
      .values({ siteId: fx.site.id, code: "BB", label: "Burnt bone", colour: "#d55e00", symbol: "square" })
      .returning();
    session.userId = fx.people.specialist.id;
    const reclassed = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "reclass", findIds: ids, classId: cls!.id },
    );
    expect(reclassed.status).toBe(200);
    expect((await rows(ids)).every((f) => f.classId === cls!.id)).toBe(true);
    // Moved, then re-classed: each change raised the version, so an edit made offline on version 1 is stale.
    expect((await rows(ids)).map((f) => f.version)).toEqual([3, 3, 3]);
    // A specialist classes finds; moving or deleting them is refused whole.
    const notTheirs = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "delete", findIds: ids, reason: "wrong" },
    );
    expect(notTheirs.status).toBe(403);
    session.userId = fx.people.director.id;
    const deleted = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "delete", findIds: ids, reason: "bag of modern glass, not finds" },
    );
    expect(deleted.json.changed).toBe(3);
    expect(await rows(ids)).toEqual([]);
    const trail = await db
      .select()
      .from(schema.auditEntries)
      .where(and(eq(schema.auditEntries.siteId, fx.site.id), inArray(schema.auditEntries.recordId, ids)));
    const byAction = (a: string) =>
      trail
        .filter((e) => e.action === a)
        .map((e) => e.recordId)
        .sort();
    expect(byAction("update")).toEqual([...ids, ...ids].sort());
    expect(byAction("delete")).toEqual([...ids].sort());
    expect(trail.filter((e) => e.action === "delete").every((e) => e.reason === "bag of modern glass, not finds")).toBe(
      true,
    );
  });

  it("refuses finds of another site and bad input, naming the field", async () => {
    const fx = await makeSite();
    const other = await makeSite();
    const mine = await find(fx, 31);
    const theirs = await find(other, 31);
    session.userId = fx.people.director.id;
    const res = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "reclass", findIds: [mine.id, theirs.id], classId: fx.cls.id },
    );
    expect(res.status).toBe(404);
    expect(res.json.error).toContain(theirs.id);
    const noReason = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "delete", findIds: [mine.id], reason: "" },
    );
    expect(noReason.status).toBe(400);
    expect(noReason.json.fieldErrors.reason).toEqual(["Say why the finds are deleted."]);
    expect(await rows([mine.id])).toHaveLength(1);
  });
});

describe("the contexts a move offers", () => {
  it("lists only contexts open to new finds in a trench with a valid outline; the server still refuses the rest", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const open = await context(fx, 8901);
    const signed = await context(fx, 8902, fx.trench.id, "signed_off");
    const [awaiting] = await db
      .insert(schema.contexts)
      .values({ siteId: fx.site.id, trenchId: fx.trench.id, number: 8903, type: "fill", state: "awaiting" })
      .returning();
    // A trench whose outline crosses itself takes no finds until it is redrawn.
    const [crossed] = await db
      .insert(schema.trenches)
      .values({
        siteId: fx.site.id,
        code: "B",
        outline: {
          type: "Polygon",
          coordinates: [
            [
              [20, 0],
              [24, 4],
              [24, 0],
              [20, 4],
              [20, 0],
            ],
          ],
        },
      })
      .returning();
    await context(fx, 8904, crossed!.id);
    const offered = await moveTargets(db, fx.site.id);
    expect(offered.map((c) => [c.trenchCode, c.number])).toEqual([
      ["A", fx.context.number],
      ["A", 8901],
    ]);
    expect(offered[1]).toEqual({ id: open.id, number: 8901, trenchId: fx.trench.id, trenchCode: "A" });
    // What is not offered is still refused when asked for directly.
    const f = await find(fx, 41);
    session.userId = fx.people.digger.id;
    for (const target of [signed, awaiting!]) {
      const res = await call(
        bulkRoute,
        "POST",
        { siteId: fx.site.id },
        { action: "move", findIds: [f.id], contextId: target.id },
      );
      expect(res.status).toBe(409);
      expect(res.json.fieldErrors.contextId).toEqual([`Context ${target.number} is not open.`]);
    }
    expect((await rows([f.id]))[0]!.contextId).toBe(fx.context.id);
  });
});

describe("a find's class is one of this site's classes", () => {
  it("refuses another site's class on a new find, an edit and a bulk reclass, naming classId; nothing is written", async () => {
    const fx = await makeSite();
    const other = await makeSite();
    const f = await find(fx, 51);
    const before = await rows([f.id]);
    const words = "That artefact class is not one of this site's classes.";
    session.userId = fx.people.director.id;
    const made = await call(
      findsRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: fx.context.id, classId: other.cls.id, x: 2, y: 2 },
    );
    const edited = await call(findRoute, "PATCH", { siteId: fx.site.id, findId: f.id }, { classId: other.cls.id });
    const reclassed = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "reclass", findIds: [f.id], classId: other.cls.id },
    );
    for (const res of [made, edited, reclassed]) {
      expect(res.status).toBe(400);
      expect(res.json.error).toBe(words);
      expect(res.json.fieldErrors).toEqual({ classId: ["Unknown class."] });
    }
    const db = await getDb();
    expect(await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id))).toEqual(before);
  });
});
