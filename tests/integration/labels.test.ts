import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { createFind, deleteFind } from "@/lib/server/finds";
import { createSample } from "@/lib/server/samples";
import { labelItems, resolveLabel } from "@/lib/server/labels";
import { loadSiteActor } from "@/lib/server/membership";
import { parseLabelCode } from "@/lib/labels/code";

describe("label codes lead to their records", () => {
  it("a find's and a sample's printed code resolve to their pages, for members only", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const actor = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
    const find = await createFind(db, actor, {
      contextId: fx.context.id,
      classId: fx.cls.id,
      x: 1,
      y: 1,
      description: "",
      method: "typed",
    });
    const sample = await createSample(db, actor, {
      contextId: fx.context.id,
      type: "charcoal",
      purpose: "dating",
      volumeL: 2,
    });
    const finds = await labelItems(db, actor.site, { kind: "finds" });
    const samples = await labelItems(db, actor.site, { kind: "samples" });
    expect(finds.items.map((i) => i.code)).toEqual([`LW/${fx.site.code}/F/1`]);
    expect(samples.items[0]).toMatchObject({
      kindWord: "Sample",
      number: 1,
      contextNumber: fx.context.number,
      what: "Charcoal for dating · 2 l",
      recorder: "Digger",
    });
    expect(await resolveLabel(db, fx.people.specialist.id, parseLabelCode(finds.items[0]!.code)!)).toBe(
      `/sites/${fx.site.id}/finds/${find.id}`,
    );
    expect(await resolveLabel(db, fx.people.specialist.id, parseLabelCode(samples.items[0]!.code)!)).toBe(
      `/sites/${fx.site.id}/samples/${sample.id}`,
    );
    // A stranger learns nothing, not even that the site exists; a deleted find's label names nothing.
    await expect(resolveLabel(db, fx.people.stranger.id, parseLabelCode(finds.items[0]!.code)!)).rejects.toMatchObject({
      status: 404,
    });
    await deleteFind(db, actor, find.id);
    await expect(
      resolveLabel(db, fx.people.digger.id, { siteCode: fx.site.code, kind: "F", number: 1 }),
    ).rejects.toMatchObject({ status: 404 });
  });

  it("puts the site's address in front when one is set, and the code still resolves", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db
      .update(schema.sites)
      .set({ labelAddress: "https://loamwork.example.org" })
      .where(eq(schema.sites.id, fx.site.id));
    const actor = await loadSiteActor(db, fx.people.digger.id, fx.site.id);
    const find = await createFind(db, actor, {
      contextId: fx.context.id,
      classId: fx.cls.id,
      x: 2,
      y: 2,
      description: "",
      method: "typed",
    });
    const { items } = await labelItems(db, actor.site, { kind: "finds", ids: [find.id] });
    expect(items[0]!.code).toBe(`https://loamwork.example.org/l/${fx.site.code}/F/1`);
    expect(await resolveLabel(db, fx.people.director.id, parseLabelCode(items[0]!.code)!)).toBe(
      `/sites/${fx.site.id}/finds/${find.id}`,
    );
    expect((await labelItems(db, actor.site, { kind: "finds", ids: [] })).items).toEqual([]);
  });
});
