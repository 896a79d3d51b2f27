import { describe, expect, it } from "vitest";
import { and, eq, inArray } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as bulkRoute from "@/app/api/sites/[siteId]/finds/bulk/route";
import * as idsRoute from "@/app/api/sites/[siteId]/finds/ids/route";
import * as boxesRoute from "@/app/api/sites/[siteId]/boxes/route";
import * as boxRoute from "@/app/api/sites/[siteId]/boxes/[boxId]/route";
import * as samplesStoreRoute from "@/app/api/sites/[siteId]/samples/store/route";

/** Issue 15 item 5: after the trench. Each find's processing and where it is; boxes and their contents. */
async function find(fx: SiteFixture, number: number, contextId = fx.context.id) {
  const db = await getDb();
  const [f] = await db
    .insert(schema.finds)
    .values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId,
      classId: fx.cls.id,
      number,
      x: 1,
      y: 1,
      method: "plan",
    })
    .returning();
  return f!;
}
async function sample(fx: SiteFixture, number: number, status: "taken" | "sent" = "taken") {
  const db = await getDb();
  const [s] = await db
    .insert(schema.samples)
    .values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId: fx.context.id,
      number,
      type: "charcoal",
      takenOn: "2026-07-14",
      status,
    })
    .returning();
  return s!;
}
const findRows = async (ids: string[]) =>
  (await getDb()).select().from(schema.finds).where(inArray(schema.finds.id, ids));
const auditOf = async (ids: string[], action: string) =>
  (await getDb())
    .select()
    .from(schema.auditEntries)
    .where(and(inArray(schema.auditEntries.recordId, ids), eq(schema.auditEntries.action, action)));
async function newBox(fx: SiteFixture, body: Record<string, unknown> = { store: "Finds store, bay 3" }) {
  session.userId = fx.people.director.id;
  const res = await call(boxesRoute, "POST", { siteId: fx.site.id }, body);
  expect(res.status, JSON.stringify(res.json)).toBe(201);
  return res.json as { id: string; number: number; store: string };
}
const process = (fx: SiteFixture, body: Record<string, unknown>) =>
  call(bulkRoute, "POST", { siteId: fx.site.id }, { action: "process", ...body });

describe("processing finds after the trench", () => {
  it("every role that processes finds washes and marks them; each find is audited and takes a new version", async () => {
    const fx = await makeSite();
    const picked = [await find(fx, 1), await find(fx, 2)];
    const ids = picked.map((f) => f.id);
    for (const [role, state] of [
      ["digger", "washed"],
      ["specialist", "marked"],
      ["director", "bagged"],
    ] as const) {
      session.userId = fx.people[role].id;
      const res = await process(fx, { findIds: ids, processing: state });
      expect(res.status, `${role}: ${JSON.stringify(res.json)}`).toBe(200);
      expect(res.json).toEqual({ action: "process", changed: 2, numbers: [1, 2] });
      expect((await findRows(ids)).map((f) => f.processing)).toEqual([state, state]);
    }
    expect((await findRows(ids)).map((f) => f.version)).toEqual([4, 4]);
    const trail = await auditOf(ids, "process");
    expect(trail).toHaveLength(6);
    expect(
      trail.filter((a) => a.recordId === ids[0]).map((a) => (a.after as { processing: string }).processing),
    ).toEqual(expect.arrayContaining(["washed", "marked", "bagged"]));
  });

  it("is not locked with the context: finds of a signed-off context are still washed and boxed", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const f = await find(fx, 5);
    await db
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffBy: fx.people.director.id, signedOffAt: new Date("2026-07-14T09:30:00Z") })
      .where(eq(schema.contexts.id, fx.context.id));
    const box = await newBox(fx);
    session.userId = fx.people.digger.id;
    const res = await process(fx, { findIds: [f.id], processing: "boxed", boxId: box.id });
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    const [after] = await findRows([f.id]);
    expect([after!.processing, after!.boxId]).toEqual(["boxed", box.id]);
  });

  it("refuses the whole change when one find cannot take it, naming it and why; nothing changes", async () => {
    const fx = await makeSite();
    const picked = [await find(fx, 11), await find(fx, 12), await find(fx, 13)];
    const ids = picked.map((f) => f.id);
    session.userId = fx.people.specialist.id;
    // Find 12 goes out to a specialist first.
    expect((await process(fx, { findIds: [ids[1]], processing: "sent", sentTo: "A. Reid, lithics" })).status).toBe(200);
    const before = await findRows(ids);
    const box = await newBox(fx);
    session.userId = fx.people.specialist.id;
    const res = await process(fx, { findIds: ids, boxId: box.id });
    expect(res.status).toBe(409);
    expect(res.json.error).toBe(
      "No find was changed: 1 find stops it. find 12: it is with a specialist (A. Reid, lithics); mark it back first",
    );
    expect(res.json.details.refused.map((r: { number: number }) => r.number)).toEqual([12]);
    expect(await findRows(ids)).toEqual(before);
    expect(await auditOf([ids[0]!, ids[2]!], "process")).toHaveLength(0);
  });

  it("only a find that was sent out comes back; sending one out names who it goes to", async () => {
    const fx = await makeSite();
    const [a, b] = [await find(fx, 21), await find(fx, 22)];
    session.userId = fx.people.digger.id;
    const unnamed = await process(fx, { findIds: [a.id], processing: "sent" });
    expect(unnamed.status).toBe(400);
    expect(unnamed.json.fieldErrors.sentTo).toEqual(["Name the specialist or laboratory it goes to."]);
    expect((await process(fx, { findIds: [a.id], processing: "sent", sentTo: "Bone lab" })).status).toBe(200);
    const both = await process(fx, { findIds: [a.id, b.id], processing: "returned" });
    expect(both.status).toBe(409);
    expect(both.json.error).toContain("find 22: it was not sent out (it is lifted, not yet processed)");
    expect((await process(fx, { findIds: [a.id], processing: "returned" })).status).toBe(200);
    // Boxed, then sent out again: it leaves its box, so the box no longer lists it.
    const box = await newBox(fx);
    session.userId = fx.people.digger.id;
    expect((await process(fx, { findIds: [a.id], processing: "boxed", boxId: box.id })).status).toBe(200);
    expect((await process(fx, { findIds: [a.id], processing: "sent", sentTo: "Bone lab" })).status).toBe(200);
    expect((await findRows([a.id]))[0]!.boxId).toBeNull();
    expect((await process(fx, { findIds: [a.id], processing: "returned" })).status).toBe(200);
    const noBox = await process(fx, { findIds: [a.id], processing: "boxed" });
    expect(noBox.status).toBe(409);
    expect(noBox.json.error).toContain("find 21: it is in no box; pick the box it is in");
    expect((await findRows([a.id]))[0]!.processing).toBe("returned");
  });

  it("refuses a box of another site, naming the field", async () => {
    const [fx, other] = [await makeSite(), await makeSite()];
    const f = await find(fx, 31);
    const theirs = await newBox(other);
    session.userId = fx.people.digger.id;
    const res = await process(fx, { findIds: [f.id], boxId: theirs.id });
    expect(res.status).toBe(400);
    expect(res.json.fieldErrors.boxId).toEqual(["Unknown box."]);
    expect((await findRows([f.id]))[0]!.boxId).toBeNull();
  });
});

describe("the box register", () => {
  it("numbers boxes per site, refuses a number taken, and lists a box's finds and samples", async () => {
    const fx = await makeSite();
    const first = await newBox(fx);
    const second = await newBox(fx, { store: "Museum store, shelf 4" });
    expect([first.number, second.number]).toEqual([1, 2]);
    const taken = await call(boxesRoute, "POST", { siteId: fx.site.id }, { number: 2 });
    expect(taken.status).toBe(409);
    expect(taken.json.error).toBe("Box 2 is already in the register.");
    const picked = [await find(fx, 43), await find(fx, 41), await find(fx, 42)];
    const s = await sample(fx, 7);
    session.userId = fx.people.digger.id;
    expect(
      (await process(fx, { findIds: picked.map((f) => f.id), processing: "boxed", boxId: second.id })).status,
    ).toBe(200);
    const stored = await call(
      samplesStoreRoute,
      "POST",
      { siteId: fx.site.id },
      { sampleIds: [s.id], boxId: second.id },
    );
    expect(stored.status, JSON.stringify(stored.json)).toBe(200);
    expect(stored.json).toEqual({ changed: 1, numbers: [7], boxNumber: 2 });
    const read = await call(boxRoute, "GET", { siteId: fx.site.id, boxId: second.id });
    expect(read.status).toBe(200);
    expect(read.json.finds.map((f: { number: number; classCode: string }) => [f.number, f.classCode])).toEqual([
      [41, "FL"],
      [42, "FL"],
      [43, "FL"],
    ]);
    expect(read.json.samples.map((x: { number: number; typeLabel: string }) => [x.number, x.typeLabel])).toEqual([
      [7, "Charcoal for dating"],
    ]);
    const list = await call(boxesRoute, "GET", { siteId: fx.site.id }, undefined, {});
    expect(
      list.json.rows.map((b: { number: number; finds: number; samples: number }) => [b.number, b.finds, b.samples]),
    ).toEqual([
      [1, 0, 0],
      [2, 3, 1],
    ]);
  });

  it("stores samples all or nothing: one sent to a specialist stops the rest, named", async () => {
    const fx = await makeSite();
    const box = await newBox(fx);
    const [a, b] = [await sample(fx, 61), await sample(fx, 62, "sent")];
    session.userId = fx.people.specialist.id;
    const res = await call(
      samplesStoreRoute,
      "POST",
      { siteId: fx.site.id },
      { sampleIds: [a.id, b.id], boxId: box.id },
    );
    expect(res.status).toBe(409);
    expect(res.json.error).toBe("No sample was stored: 1 sample stops it. sample 62: it is with a specialist");
    const db = await getDb();
    const rows = await db
      .select()
      .from(schema.samples)
      .where(inArray(schema.samples.id, [a.id, b.id]));
    expect(rows.map((r) => r.boxId)).toEqual([null, null]);
  });

  it("is for members only: a stranger neither reads a box nor adds one", async () => {
    const fx = await makeSite();
    const box = await newBox(fx);
    session.userId = fx.people.stranger.id;
    expect((await call(boxRoute, "GET", { siteId: fx.site.id, boxId: box.id })).status).toBe(404);
    expect((await call(boxesRoute, "POST", { siteId: fx.site.id }, { store: "x" })).status).toBe(404);
  });
});

describe("deleting a box", () => {
  it("an empty box made by mistake is deleted by any role that adds boxes, audited; its number is free again", async () => {
    const fx = await makeSite();
    for (const role of ["digger", "specialist", "director"] as const) {
      const box = await newBox(fx);
      session.userId = fx.people[role].id;
      const res = await call(boxRoute, "DELETE", { siteId: fx.site.id, boxId: box.id });
      expect(res.status, `${role}: ${JSON.stringify(res.json)}`).toBe(200);
      expect(res.json).toEqual({ deleted: box.id, number: 1 });
      expect((await call(boxRoute, "GET", { siteId: fx.site.id, boxId: box.id })).status).toBe(404);
      const [entry] = await auditOf([box.id], "delete");
      expect(entry).toMatchObject({ actorId: fx.people[role].id, recordType: "box" });
      expect((entry!.before as { number: number; store: string }).store).toBe("Finds store, bay 3");
    }
  });

  it("a box still holding finds or samples is refused, saying how many; nothing is deleted", async () => {
    const fx = await makeSite();
    const box = await newBox(fx);
    const picked = [await find(fx, 81), await find(fx, 82)];
    const s = await sample(fx, 83);
    session.userId = fx.people.digger.id;
    await process(fx, { findIds: picked.map((f) => f.id), processing: "boxed", boxId: box.id });
    await call(samplesStoreRoute, "POST", { siteId: fx.site.id }, { sampleIds: [s.id], boxId: box.id });
    const res = await call(boxRoute, "DELETE", { siteId: fx.site.id, boxId: box.id });
    expect(res.status).toBe(409);
    expect(res.json.error).toBe(
      "Box 1 still holds 2 finds and 1 sample; only an empty box can be deleted. Move them to another box first, then delete the box.",
    );
    expect(res.json.details).toEqual({ finds: 2, samples: 1 });
    expect(await auditOf([box.id], "delete")).toHaveLength(0);
    // Emptied with the bulk tools, it goes.
    const other = await newBox(fx);
    session.userId = fx.people.digger.id;
    expect((await process(fx, { findIds: picked.map((f) => f.id), boxId: other.id })).status).toBe(200);
    const one = await call(boxRoute, "DELETE", { siteId: fx.site.id, boxId: box.id });
    expect(one.json.error).toBe(
      "Box 1 still holds 1 sample; only an empty box can be deleted. Move it to another box first, then delete the box.",
    );
    await call(samplesStoreRoute, "POST", { siteId: fx.site.id }, { sampleIds: [s.id], boxId: null });
    expect((await call(boxRoute, "DELETE", { siteId: fx.site.id, boxId: box.id })).status).toBe(200);
  });

  it("a box of another site is not found, and a stranger deletes nothing", async () => {
    const [fx, other] = [await makeSite(), await makeSite()];
    const theirs = await newBox(other);
    session.userId = fx.people.director.id;
    expect((await call(boxRoute, "DELETE", { siteId: fx.site.id, boxId: theirs.id })).status).toBe(404);
    session.userId = fx.people.stranger.id;
    expect((await call(boxRoute, "DELETE", { siteId: other.site.id, boxId: theirs.id })).status).toBe(404);
    const db = await getDb();
    expect(await db.select().from(schema.boxes).where(eq(schema.boxes.id, theirs.id))).toHaveLength(1);
  });
});

describe("select all that match", () => {
  it("gives the ids of every find the register's filters select, across pages", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [other] = await db
      .insert(schema.contexts)
      .values({ siteId: fx.site.id, trenchId: fx.trench.id, number: 9901, type: "fill" })
      .returning();
    const inOther = [await find(fx, 71, other!.id), await find(fx, 72, other!.id)];
    await find(fx, 73);
    session.userId = fx.people.specialist.id;
    const res = await call(idsRoute, "GET", { siteId: fx.site.id }, undefined, { contextId: other!.id });
    expect(res.status).toBe(200);
    expect(res.json).toEqual({ total: 2, ids: inOther.map((f) => f.id), truncated: false });
  });
});
