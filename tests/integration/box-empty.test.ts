import { describe, expect, it } from "vitest";
import { and, eq, inArray } from "drizzle-orm";
import { call, session } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as boxEmptyRoute from "@/app/api/sites/[siteId]/boxes/[boxId]/empty/route";
import * as boxRoute from "@/app/api/sites/[siteId]/boxes/[boxId]/route";
import { makeBox, makeSample } from "./role-cases/archive";
import { insertFind } from "./role-cases/core";

/** Emptying a box into another: a finds specialist moves everything in one box to another in one go. */
async function boxWith(fx: SiteFixture, nFinds: number, nSamples: number) {
  const db = await getDb();
  const box = await makeBox(fx);
  const found = [];
  for (let i = 0; i < nFinds; i++) found.push(await insertFind(fx));
  const taken = [];
  for (let i = 0; i < nSamples; i++) taken.push(await makeSample(fx));
  if (found.length)
    await db
      .update(schema.finds)
      .set({ boxId: box.id, processing: "boxed" })
      .where(
        inArray(
          schema.finds.id,
          found.map((f) => f.id),
        ),
      );
  if (taken.length)
    await db
      .update(schema.samples)
      .set({ boxId: box.id, location: "Finds store" })
      .where(
        inArray(
          schema.samples.id,
          taken.map((s) => s.id),
        ),
      );
  return { box, finds: found, samples: taken };
}
const empty = (fx: SiteFixture, boxId: string, body: unknown) =>
  call(boxEmptyRoute, "POST", { siteId: fx.site.id, boxId }, body);
const boxIdsOf = async (table: typeof schema.finds | typeof schema.samples, ids: string[]) =>
  (await (await getDb()).select({ boxId: table.boxId }).from(table).where(inArray(table.id, ids))).map((r) => r.boxId);
const auditsOf = async (ids: string[]) =>
  (await getDb()).select().from(schema.auditEntries).where(inArray(schema.auditEntries.recordId, ids));

describe("emptying a box into another", () => {
  it("moves every find and sample in one go, each audited as boxing is, finds taking a new version", async () => {
    const fx = await makeSite();
    const from = await boxWith(fx, 3, 2);
    const into = await boxWith(fx, 1, 0);
    // Processing comes after the trench: finds of a signed-off context still move.
    await (
      await getDb()
    )
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffAt: new Date() })
      .where(eq(schema.contexts.id, fx.context.id));
    session.userId = fx.people.specialist.id;
    const res = await empty(fx, from.box.id, { intoBoxId: into.box.id });
    expect(res.status, JSON.stringify(res.json)).toBe(200);
    expect(res.json).toEqual({
      from: from.box.number,
      into: into.box.number,
      findNumbers: from.finds.map((f) => f.number).sort((a, b) => a - b),
      sampleNumbers: from.samples.map((s) => s.number).sort((a, b) => a - b),
    });
    const findIds = from.finds.map((f) => f.id);
    const sampleIds = from.samples.map((s) => s.id);
    expect(await boxIdsOf(schema.finds, findIds)).toEqual([into.box.id, into.box.id, into.box.id]);
    expect(await boxIdsOf(schema.samples, sampleIds)).toEqual([into.box.id, into.box.id]);
    expect(await boxIdsOf(schema.finds, [into.finds[0]!.id])).toEqual([into.box.id]);
    const db = await getDb();
    const versions = await db.select().from(schema.finds).where(inArray(schema.finds.id, findIds));
    expect(versions.map((f) => f.version)).toEqual(from.finds.map((f) => f.version + 1));
    expect(versions.every((f) => f.processing === "boxed")).toBe(true);

    const audits = await auditsOf([...findIds, ...sampleIds]);
    expect(audits).toHaveLength(5);
    const why = `Box ${from.box.number} emptied into box ${into.box.number}`;
    for (const f of from.finds)
      expect(audits.find((a) => a.recordId === f.id)).toMatchObject({
        action: "process",
        recordType: "find",
        actorId: fx.people.specialist.id,
        reason: why,
        before: { boxId: from.box.id, processing: "boxed", version: f.version },
        after: { boxId: into.box.id, processing: "boxed", version: f.version + 1, boxNumber: into.box.number },
      });
    for (const s of from.samples)
      expect(audits.find((a) => a.recordId === s.id)).toMatchObject({
        action: "store",
        recordType: "sample",
        reason: why,
        before: { boxId: from.box.id, location: "Finds store" },
        after: { boxId: into.box.id, location: "Finds store", boxNumber: into.box.number },
      });
    // The emptied box can now be deleted; the other lists everything.
    const read = await call(boxRoute, "GET", { siteId: fx.site.id, boxId: into.box.id });
    expect((read.json as { finds: unknown[]; samples: unknown[] }).finds).toHaveLength(4);
    expect((read.json as { finds: unknown[]; samples: unknown[] }).samples).toHaveLength(2);
    expect((await call(boxRoute, "DELETE", { siteId: fx.site.id, boxId: from.box.id })).status).toBe(200);
  });

  it("refuses, naming the field, a box into itself, another site's box, a deleted box or none; nothing moves", async () => {
    const [fx, other] = [await makeSite(), await makeSite()];
    const from = await boxWith(fx, 2, 1);
    const theirs = await makeBox(other);
    const gone = await makeBox(fx);
    await (await getDb()).delete(schema.boxes).where(eq(schema.boxes.id, gone.id));
    session.userId = fx.people.specialist.id;
    const cases: [unknown, string, string][] = [
      [
        { intoBoxId: from.box.id },
        `Box ${from.box.number} cannot be emptied into itself; pick another box.`,
        "Pick another box.",
      ],
      [
        { intoBoxId: theirs.id },
        "The box to empty it into is not one of this site's boxes: it may have been deleted.",
        "Unknown box.",
      ],
      [
        { intoBoxId: gone.id },
        "The box to empty it into is not one of this site's boxes: it may have been deleted.",
        "Unknown box.",
      ],
      [{}, "", "Pick the box to empty it into."],
      [{ intoBoxId: "box 4" }, "", "Not a valid record id."],
    ];
    for (const [body, message, field] of cases) {
      const res = await empty(fx, from.box.id, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      if (message) expect(res.json.error).toBe(message);
      expect(res.json.fieldErrors.intoBoxId).toEqual([field]);
    }
    expect(
      await boxIdsOf(
        schema.finds,
        from.finds.map((f) => f.id),
      ),
    ).toEqual([from.box.id, from.box.id]);
    expect(await boxIdsOf(schema.samples, [from.samples[0]!.id])).toEqual([from.box.id]);
    expect(await auditsOf([...from.finds.map((f) => f.id), from.samples[0]!.id])).toHaveLength(0);
  });

  it("racing a deletion of the other box, one of the two is refused cleanly and no find is left in a lost box", async () => {
    const fx = await makeSite();
    const from = await boxWith(fx, 2, 1);
    const into = await makeBox(fx);
    session.userId = fx.people.specialist.id;
    const [moved, deleted] = await Promise.all([
      empty(fx, from.box.id, { intoBoxId: into.id }),
      call(boxRoute, "DELETE", { siteId: fx.site.id, boxId: into.id }),
    ]);
    const outcome = [moved.status, deleted.status].join(" ");
    expect(["200 409", "400 200"], JSON.stringify([moved.json, deleted.json])).toContain(outcome);
    const where = await boxIdsOf(
      schema.finds,
      from.finds.map((f) => f.id),
    );
    expect(where).toEqual(outcome === "200 409" ? [into.id, into.id] : [from.box.id, from.box.id]);
  });

  it("an empty box, or one of another site, is refused plainly", async () => {
    const [fx, other] = [await makeSite(), await makeSite()];
    const [bare, into] = [await makeBox(fx), await makeBox(fx)];
    const theirs = await boxWith(other, 1, 0);
    session.userId = fx.people.digger.id;
    const res = await empty(fx, bare.id, { intoBoxId: into.id });
    expect(res.status).toBe(409);
    expect(res.json.error).toBe(`Box ${bare.number} is empty: nothing was moved.`);
    expect((await empty(fx, theirs.box.id, { intoBoxId: into.id })).status).toBe(404);
    session.userId = fx.people.stranger.id;
    expect((await empty(other, theirs.box.id, { intoBoxId: into.id })).status).toBe(404);
    const [still] = await (
      await getDb()
    )
      .select()
      .from(schema.finds)
      .where(and(eq(schema.finds.id, theirs.finds[0]!.id), eq(schema.finds.boxId, theirs.box.id)));
    expect(still).toBeDefined();
  });
});
