import { describe, expect, it } from "vitest";
import { eq, inArray } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { insertFindRow } from "../support/rows";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import * as bulkRoute from "@/app/api/sites/[siteId]/finds/bulk/route";

/** A record with photos in the photo register is not deleted, and the refusal says why and what to do. */
const find = insertFindRow;
let photoN = 0;
async function photoOf(fx: SiteFixture, of: { findId: string } | { contextId: string }) {
  photoN++;
  await (await getDb()).insert(schema.photos).values({
    siteId: fx.site.id,
    kind: "record",
    number: photoN,
    ...of,
    fileKey: `photo-key-${crypto.randomUUID()}`,
    fileName: `photo ${photoN}.jpg`,
    mimeType: "image/jpeg",
  });
}
const stillThere = async (ids: string[]) =>
  (await (await getDb()).select().from(schema.finds).where(inArray(schema.finds.id, ids))).length;

describe("deleting a record that has photos", () => {
  it("a find with photos is refused, saying how many and what to do; nothing is deleted", async () => {
    const fx = await makeSite();
    const f = await find(fx, 51);
    await photoOf(fx, { findId: f.id });
    await photoOf(fx, { findId: f.id });
    session.userId = fx.people.digger.id;
    const res = await call(findRoute, "DELETE", { siteId: fx.site.id, findId: f.id });
    expect(res.status).toBe(409);
    expect(res.json.error).toBe(
      "Find 51 was not deleted: it has 2 photos in the photo register; delete those photos there first (each with a reason), or keep it.",
    );
    expect(await stillThere([f.id])).toBe(1);
  });

  it("a context with a photo is refused the same way", async () => {
    const fx = await makeSite();
    await photoOf(fx, { contextId: fx.context.id });
    session.userId = fx.people.director.id;
    const res = await call(contextRoute, "DELETE", { siteId: fx.site.id, contextId: fx.context.id });
    expect(res.status).toBe(409);
    expect(res.json.error).toBe(
      `Context ${fx.context.number} was not deleted: it has 1 photo in the photo register; delete that photo there first (with a reason), or keep it.`,
    );
    const db = await getDb();
    expect(await db.select().from(schema.contexts).where(eq(schema.contexts.id, fx.context.id))).toHaveLength(1);
  });

  it("a bulk delete names each find with photos, and deletes none", async () => {
    const fx = await makeSite();
    const picked = [await find(fx, 61), await find(fx, 62), await find(fx, 63)];
    await photoOf(fx, { findId: picked[1]!.id });
    session.userId = fx.people.digger.id;
    const ids = picked.map((f) => f.id);
    const res = await call(
      bulkRoute,
      "POST",
      { siteId: fx.site.id },
      { action: "delete", findIds: ids, reason: "Entered twice." },
    );
    expect(res.status).toBe(409);
    expect(res.json.error).toBe(
      "No find was deleted: 1 find stops it. find 62: it has 1 photo in the photo register; delete that photo there first (with a reason), or keep it",
    );
    expect(res.json.details.refused).toEqual([
      { findId: picked[1]!.id, number: 62, reason: expect.stringContaining("1 photo") },
    ]);
    expect(await stillThere(ids)).toBe(3);
  });
});
