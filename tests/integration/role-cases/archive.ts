import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import type { SiteFixture } from "../../support/fixtures";
import { nextCount, type RoleCases } from "./types";
import * as samplesRoute from "@/app/api/sites/[siteId]/samples/route";
import * as sampleRoute from "@/app/api/sites/[siteId]/samples/[sampleId]/route";
import * as sampleStatusRoute from "@/app/api/sites/[siteId]/samples/status/route";
import * as drawingsRoute from "@/app/api/sites/[siteId]/drawings/route";
import * as drawingRoute from "@/app/api/sites/[siteId]/drawings/[drawingId]/route";
import * as findsBulkRoute from "@/app/api/sites/[siteId]/finds/bulk/route";
import * as samplesStoreRoute from "@/app/api/sites/[siteId]/samples/store/route";
import * as boxesRoute from "@/app/api/sites/[siteId]/boxes/route";
import * as boxRoute from "@/app/api/sites/[siteId]/boxes/[boxId]/route";
import * as boxEmptyRoute from "@/app/api/sites/[siteId]/boxes/[boxId]/empty/route";
import * as recordPhotoRoute from "@/app/api/sites/[siteId]/record-photos/[photoId]/route";
import { insertFind } from "./core";

/** A box of the fixture's site, inserted directly so only the call under test writes. */
export async function makeBox(fx: SiteFixture, store = "Finds store, bay 2") {
  const db = await getDb();
  const [b] = await db
    .insert(schema.boxes)
    .values({ siteId: fx.site.id, number: 90_000 + nextCount(), store })
    .returning();
  return b!;
}

/** A sample of the fixture's context (or another), inserted directly so only the call under test writes. */
export async function makeSample(fx: SiteFixture, contextId = fx.context.id) {
  const db = await getDb();
  const [s] = await db
    .insert(schema.samples)
    .values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId,
      number: 70_000 + nextCount(),
      type: "bulk",
      takenOn: "2026-07-01",
      volumeL: 40,
    })
    .returning();
  return s!;
}

/** A drawing showing the fixture's context (or another), inserted directly so only the call under test writes. */
export async function makeDrawing(fx: SiteFixture, contextId = fx.context.id) {
  const db = await getDb();
  const [d] = await db
    .insert(schema.drawings)
    .values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      number: 80_000 + nextCount(),
      kind: "section",
      scale: 10,
      drawnOn: "2026-07-01",
    })
    .returning();
  await db.insert(schema.drawingContexts).values({ drawingId: d!.id, contextId });
  return d!;
}

/**
 * A record photo of the fixture's context (or of another record), inserted directly so only the call under test writes.
 */
export async function makeRecordPhoto(
  fx: SiteFixture,
  of: { contextId?: string; findId?: string; trenchId?: string } = { contextId: fx.context.id },
) {
  const db = await getDb();
  const n = nextCount();
  const [p] = await db
    .insert(schema.photos)
    .values({
      siteId: fx.site.id,
      kind: "record",
      ...of,
      number: 90_000 + n,
      scale: "1 m",
      fileKey: `test-record-photo-${fx.site.id}-${n}`,
      fileName: `photo-${n}.jpg`,
      mimeType: "image/jpeg",
    })
    .returning();
  return p!;
}

/** Mutating operations of the archive registers. */
export const archiveCases: RoleCases = {
  samplesCreate: async (fx) => ({
    mod: samplesRoute,
    params: { siteId: fx.site.id },
    body: {
      contextId: fx.context.id,
      type: "charcoal",
      x: 1.5,
      y: 1.5,
      z: 49.2,
      purpose: "radiocarbon date of the hearth",
    },
  }),
  sampleUpdate: async (fx) => {
    const s = await makeSample(fx);
    return { mod: sampleRoute, params: { siteId: fx.site.id, sampleId: s.id }, body: { volumeL: 30 + nextCount() } };
  },
  sampleDelete: async (fx) => {
    const s = await makeSample(fx);
    return { mod: sampleRoute, params: { siteId: fx.site.id, sampleId: s.id }, body: { reason: "entered twice" } };
  },
  samplesStatus: async (fx) => {
    const s = await makeSample(fx);
    return { mod: sampleStatusRoute, params: { siteId: fx.site.id }, body: { sampleIds: [s.id], status: "processed" } };
  },
  drawingsCreate: async (fx) => ({
    mod: drawingsRoute,
    params: { siteId: fx.site.id },
    body: { kind: "plan", scale: 20, contextIds: [fx.context.id], title: "Plan of the hearth" },
  }),
  drawingUpdate: async (fx) => {
    const d = await makeDrawing(fx);
    return { mod: drawingRoute, params: { siteId: fx.site.id, drawingId: d.id }, body: { scale: 10 + nextCount() } };
  },
  drawingDelete: async (fx) => {
    const d = await makeDrawing(fx);
    return { mod: drawingRoute, params: { siteId: fx.site.id, drawingId: d.id }, body: { reason: "entered twice" } };
  },
  recordPhotoUpdate: async (fx) => {
    const p = await makeRecordPhoto(fx);
    return {
      mod: recordPhotoRoute,
      params: { siteId: fx.site.id, photoId: p.id },
      body: { caption: `Section, facing ${nextCount()}` },
    };
  },
  recordPhotoDelete: async (fx) => {
    const p = await makeRecordPhoto(fx);
    return { mod: recordPhotoRoute, params: { siteId: fx.site.id, photoId: p.id }, body: { reason: "out of focus" } };
  },
  // Re-classing: the one bulk change every role may make (moving and deleting are tested in finds-bulk.test.ts).
  findsBulk: async (fx) => {
    const [a, b] = [await insertFind(fx), await insertFind(fx)];
    const db = await getDb();
    const [cls] = await db
      .insert(schema.artefactClasses)
      .values({
        siteId: fx.site.id,
        code: `BK${nextCount()}`,
        label: "Burnt flint",
        colour: "#e69f00",
        symbol: "cross",
      })
      .returning();
    return {
      mod: findsBulkRoute,
      params: { siteId: fx.site.id },
      body: { action: "reclass", findIds: [a.id, b.id], classId: cls!.id },
    };
  },
  samplesStore: async (fx) => {
    const [s, b] = [await makeSample(fx), await makeBox(fx)];
    return { mod: samplesStoreRoute, params: { siteId: fx.site.id }, body: { sampleIds: [s.id], boxId: b.id } };
  },
  boxesCreate: async (fx) => ({ mod: boxesRoute, params: { siteId: fx.site.id }, body: { store: "Finds store" } }),
  boxUpdate: async (fx) => {
    const b = await makeBox(fx);
    return { mod: boxRoute, params: { siteId: fx.site.id, boxId: b.id }, body: { store: "Museum store, shelf 4" } };
  },
  boxDelete: async (fx) => {
    const b = await makeBox(fx);
    return { mod: boxRoute, params: { siteId: fx.site.id, boxId: b.id } };
  },
  boxEmpty: async (fx) => {
    const [from, into, f] = [await makeBox(fx), await makeBox(fx), await insertFind(fx)];
    await (await getDb()).update(schema.finds).set({ boxId: from.id }).where(eq(schema.finds.id, f.id));
    return { mod: boxEmptyRoute, params: { siteId: fx.site.id, boxId: from.id }, body: { intoBoxId: into.id } };
  },
};
