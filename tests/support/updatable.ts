import fc from "fast-check";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { contextTypes } from "@/lib/schemas/context";
import { symbolShapes } from "@/lib/schemas/artefact-class";
import { roles } from "@/lib/schemas/common";
import * as siteRoute from "@/app/api/sites/[siteId]/route";
import * as memberRoute from "@/app/api/sites/[siteId]/members/[userId]/route";
import * as classRoute from "@/app/api/sites/[siteId]/classes/[classId]/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import * as datumRoute from "@/app/api/sites/[siteId]/datum/route";
import * as benchmarkRoute from "@/app/api/sites/[siteId]/benchmarks/[benchmarkId]/route";
import * as sampleRoute from "@/app/api/sites/[siteId]/samples/[sampleId]/route";
import * as drawingRoute from "@/app/api/sites/[siteId]/drawings/[drawingId]/route";
import * as boxRoute from "@/app/api/sites/[siteId]/boxes/[boxId]/route";
import * as recordPhotoRoute from "@/app/api/sites/[siteId]/record-photos/[photoId]/route";
import * as spitRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/spits/[spitId]/route";
import { makeSite, type SiteFixture } from "./fixtures";
import { insertContext, insertFindRow, insertMember, insertTrench } from "./rows";

export type UpdateFixture = SiteFixture & { alt: { contextId: string; classId: string } };

let counter = 0;
const unique = () => ++counter;

/** A record ready to change: its route's path parameters and a way to read its stored row back. */
export type Target = { params: Record<string, string>; read: () => Promise<Record<string, unknown>> };

/**
 * Every catalogued update (PATCH) as a test drives it: the route, a fresh record to change on a site, and
 * for each field its schema names, generated valid values (already trimmed and in range, so the stored
 * value equals the value sent).
 */
export type Updatable = {
  mod: any;
  target: (fx: SiteFixture) => Promise<Target>;
  fields: (fx: UpdateFixture) => Record<string, fc.Arbitrary<unknown>>;
};

const text = (max = 40) => fc.string({ maxLength: max }).map((s) => s.trim());
const label = fc
  .string({ minLength: 1, maxLength: 30 })
  .map((s) => s.trim())
  .filter((s) => s.length > 0);
/** Decimals with three places, never -0 (JSON writes -0 as 0). */
const decimal = (min: number, max: number) => fc.integer({ min: min * 1000, max: max * 1000 }).map((n) => n / 1000 + 0);
const rectangle = (x0: number, y0: number) =>
  fc
    .record({ x: decimal(x0, x0 + 5), y: decimal(y0, y0 + 5), w: decimal(1, 20), h: decimal(1, 20) })
    .map(({ x, y, w, h }) => ({
      type: "Polygon" as const,
      coordinates: [
        [
          [x, y],
          [x + w, y],
          [x + w, y + h],
          [x, y + h],
          [x, y],
        ],
      ],
    }));
const utm30 = "+proj=utm +zone=30 +datum=WGS84 +units=m +no_defs";

async function rowOf(table: any, id: string) {
  const db = await getDb();
  const [row] = await db.select().from(table).where(eq(table.id, id));
  return row as Record<string, unknown>;
}

export const updatables: Record<string, Updatable> = {
  datumUpdate: {
    mod: datumRoute,
    target: async (fx) => ({ params: { siteId: fx.site.id }, read: () => rowOf(schema.sites, fx.site.id) }),
    fields: () => ({
      datumKind: fc.constantFrom("national", "local"),
      datumName: label,
      levelTolerance: decimal(0, 0.5),
    }),
  },
  benchmarkUpdate: {
    mod: benchmarkRoute,
    target: async (fx) => {
      const db = await getDb();
      const [b] = await db
        .insert(schema.benchmarks)
        .values({ siteId: fx.site.id, code: `TBM ${unique()}`, description: "", x: 0, y: 0, level: 50 })
        .returning();
      return { params: { siteId: fx.site.id, benchmarkId: b!.id }, read: () => rowOf(schema.benchmarks, b!.id) };
    },
    fields: () => ({
      code: label.map((c) => c.slice(0, 40)),
      description: text(),
      x: decimal(-1000, 1000),
      y: decimal(-1000, 1000),
      level: decimal(-100, 3000),
    }),
  },
  spitUpdate: {
    mod: spitRoute,
    target: async (fx) => {
      const db = await getDb();
      const [s] = await db
        .insert(schema.spits)
        .values({ siteId: fx.site.id, contextId: fx.context.id, number: 1 })
        .returning();
      return {
        params: { siteId: fx.site.id, contextId: fx.context.id, spitId: s!.id },
        read: () => rowOf(schema.spits, s!.id),
      };
    },
    // Tops above bases whatever subset is sent, so every patch is valid.
    fields: () => ({
      number: fc.integer({ min: 1, max: 999 }),
      topLevel: fc.constantFrom(null, 45.5, 44.125),
      baseLevel: fc.constantFrom(null, 40.25, 39.5),
    }),
  },
  siteUpdate: {
    mod: siteRoute,
    target: async (fx) => ({ params: { siteId: fx.site.id }, read: () => rowOf(schema.sites, fx.site.id) }),
    fields: () => ({
      name: label,
      gridDescription: text(),
      gridOriginX: decimal(-1000, 1000),
      gridOriginY: decimal(-1000, 1000),
      crs: fc.constantFrom(null, utm30),
      // No sample exists on the fixture's site, so the numbering may still be chosen.
      samplesShareFindNumbers: fc.boolean(),
      numberBlockSize: fc.integer({ min: 5, max: 1000 }),
      labelAddress: fc.constantFrom(null, "https://loamwork.example.org", "http://10.0.0.2:3000/lw"),
      levelSpreadCaution: decimal(0.01, 10),
    }),
  },
  memberUpdate: {
    mod: memberRoute,
    target: async (fx) => {
      const u = await insertMember(fx, "Member");
      const db = await getDb();
      return {
        params: { siteId: fx.site.id, userId: u.id },
        read: async () => {
          const [row] = await db
            .select()
            .from(schema.memberships)
            .where(and(eq(schema.memberships.siteId, fx.site.id), eq(schema.memberships.userId, u.id)));
          return row as Record<string, unknown>;
        },
      };
    },
    fields: () => ({ role: fc.constantFrom(...roles) }),
  },
  classUpdate: {
    mod: classRoute,
    target: async (fx) => {
      const db = await getDb();
      const [c] = await db
        .insert(schema.artefactClasses)
        .values({ siteId: fx.site.id, code: `K${unique()}`, label: "Sherd", colour: "#009e73", symbol: "disc" })
        .returning();
      return { params: { siteId: fx.site.id, classId: c.id }, read: () => rowOf(schema.artefactClasses, c.id) };
    },
    fields: () => ({
      code: fc.integer({ min: 0, max: 99 }).map((k) => `K${unique()}_${k}`),
      label,
      material: text(),
      colour: fc.integer({ min: 0, max: 0xffffff }).map((n) => `#${n.toString(16).padStart(6, "0")}`),
      symbol: fc.constantFrom(...symbolShapes),
      humanRemains: fc.boolean(),
    }),
  },
  trenchUpdate: {
    mod: trenchRoute,
    target: async (fx) => {
      const t = await insertTrench(fx, `U${unique()}`, [
        [0, 0],
        [5, 0],
        [5, 5],
        [0, 5],
        [0, 0],
      ]);
      return { params: { siteId: fx.site.id, trenchId: t.id }, read: () => rowOf(schema.trenches, t.id) };
    },
    fields: () => ({
      code: fc.integer({ min: 0, max: 99 }).map((k) => `U${unique()}-${k}`),
      name: text(),
      outline: rectangle(0, 0),
      surfaceLevel: fc.option(decimal(-100, 3000), { nil: null }),
      // Sizes that cut any generated outline (at most 25 m × 25 m) into well under the squares' limit.
      squareSize: fc.option(fc.constantFrom(0.5, 1, 2), { nil: null }),
      squareOriginX: fc.option(decimal(-10, 10), { nil: null }),
      squareOriginY: fc.option(decimal(-10, 10), { nil: null }),
    }),
  },
  contextUpdate: {
    mod: contextRoute,
    target: async (fx) => {
      const c = await insertContext(fx, 300_000 + unique(), "fill");
      return { params: { siteId: fx.site.id, contextId: c.id }, read: () => rowOf(schema.contexts, c.id) };
    },
    fields: () => ({
      number: fc.integer({ min: 0, max: 999 }).map((k) => 1_000_000 + unique() * 1000 + k),
      type: fc.constantFrom(...contextTypes),
      colour: text(),
      compaction: text(),
      composition: text(),
      inclusions: text(),
      description: text(),
      interpretation: text(),
      extent: fc.option(rectangle(0, 0), { nil: null }),
      lengthM: fc.option(decimal(0, 50), { nil: null }),
      widthM: fc.option(decimal(0, 50), { nil: null }),
      thicknessM: fc.option(decimal(0, 3), { nil: null }),
      excavatedBy: text(),
      // Opened in May, closed in June: any subset keeps the dates in order.
      openedOn: fc.option(
        fc.integer({ min: 1, max: 31 }).map((d) => `2026-05-${String(d).padStart(2, "0")}`),
        { nil: null },
      ),
      closedOn: fc.option(
        fc.integer({ min: 1, max: 30 }).map((d) => `2026-06-${String(d).padStart(2, "0")}`),
        { nil: null },
      ),
      digMethod: fc.constantFrom(null, "sieved"),
      sieveMeshMm: fc.option(fc.constantFrom(2, 4, 10), { nil: null }),
    }),
  },
  findUpdate: {
    mod: findRoute,
    target: async (fx) => {
      const f = await insertFindRow(fx, 500_000 + unique());
      return { params: { siteId: fx.site.id, findId: f.id }, read: () => rowOf(schema.finds, f.id) };
    },
    fields: (fx) => ({
      contextId: fc.constantFrom(fx.context.id, fx.alt.contextId),
      classId: fc.constantFrom(fx.cls.id, fx.alt.classId),
      // Inside trench A (10 × 6 m) and clear of its baulk (x 4–6, y 2–3).
      x: decimal(0.5, 3.5),
      y: decimal(0.5, 5.5),
      z: fc.option(decimal(-5, 50), { nil: null }),
      count: fc.option(fc.integer({ min: 1, max: 1000 }), { nil: null }),
      weightG: fc.option(decimal(0, 5000), { nil: null }),
      description: text(),
    }),
  },
};

const sampleTypes = [
  "bulk",
  "spot",
  "charcoal",
  "monolith",
  "micromorphology",
  "pollen",
  "luminescence",
  "other",
] as const;

updatables.sampleUpdate = {
  mod: sampleRoute,
  target: async (fx) => {
    const db = await getDb();
    const [s] = await db
      .insert(schema.samples)
      .values({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        contextId: fx.context.id,
        number: 600_000 + unique(),
        type: "bulk",
        takenOn: "2026-07-01",
        x: 1,
        y: 1,
      })
      .returning();
    // Spit 1 in both contexts, so a sample taken from spit 1 may move between them.
    const spitIds = new Map<string, number>();
    for (const contextId of [fx.context.id, (fx as UpdateFixture).alt?.contextId].filter(Boolean) as string[]) {
      const [sp] = await db.insert(schema.spits).values({ siteId: fx.site.id, contextId, number: 1 }).returning();
      spitIds.set(sp!.id, 1);
    }
    const read = async () => {
      const row = await rowOf(schema.samples, s!.id);
      return { ...row, spit: row.spitId ? (spitIds.get(row.spitId as string) ?? null) : null };
    };
    return { params: { siteId: fx.site.id, sampleId: s!.id }, read };
  },
  fields: (fx) => ({
    contextId: fc.constantFrom(fx.context.id, fx.alt.contextId),
    spit: fc.constantFrom(null, 1),
    type: fc.constantFrom(...sampleTypes),
    // The sample is plotted, so x or y alone keeps a point; inside trench A and clear of its baulk.
    x: decimal(0.5, 3.5),
    y: decimal(0.5, 5.5),
    z: fc.option(decimal(-5, 50), { nil: null }),
    volumeL: fc.option(decimal(0.5, 200), { nil: null }),
    purpose: text(),
    takenBy: fc.constantFrom(null, fx.people.digger.id, fx.people.director.id),
    takenOn: fc.integer({ min: 1, max: 30 }).map((d) => `2026-06-${String(d).padStart(2, "0")}`),
  }),
};

updatables.drawingUpdate = {
  mod: drawingRoute,
  target: async (fx) => {
    const db = await getDb();
    const [d] = await db
      .insert(schema.drawings)
      .values({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        number: 700_000 + unique(),
        kind: "plan",
        scale: 20,
        drawnOn: "2026-07-01",
      })
      .returning();
    await db.insert(schema.drawingContexts).values({ drawingId: d!.id, contextId: fx.context.id });
    const read = async () => {
      const row = await rowOf(schema.drawings, d!.id);
      const shown = await db
        .select({ id: schema.contexts.id, number: schema.contexts.number })
        .from(schema.drawingContexts)
        .innerJoin(schema.contexts, eq(schema.contexts.id, schema.drawingContexts.contextId))
        .where(eq(schema.drawingContexts.drawingId, d!.id));
      return { ...row, contextIds: shown.sort((a, b) => a.number - b.number).map((c) => c.id) };
    };
    return { params: { siteId: fx.site.id, drawingId: d!.id }, read };
  },
  fields: (fx) => ({
    kind: fc.constantFrom("plan", "section"),
    scale: fc.constantFrom(1, 10, 20, 50, 100, 1000),
    // The alternative context's number is higher than the fixture's, so this order is the stored order.
    contextIds: fc.constantFrom([fx.context.id], [fx.alt.contextId], [fx.context.id, fx.alt.contextId]),
    title: text(),
    drawnBy: fc.constantFrom(null, fx.people.digger.id, fx.people.director.id),
    drawnOn: fc.integer({ min: 1, max: 30 }).map((d) => `2026-06-${String(d).padStart(2, "0")}`),
  }),
};

updatables.boxUpdate = {
  mod: boxRoute,
  target: async (fx) => {
    const db = await getDb();
    const [b] = await db
      .insert(schema.boxes)
      .values({ siteId: fx.site.id, number: 800_000 + unique(), store: "Finds store, bay 1" })
      .returning();
    return { params: { siteId: fx.site.id, boxId: b!.id }, read: () => rowOf(schema.boxes, b!.id) };
  },
  fields: () => ({
    number: fc.integer({ min: 1, max: 999_999 }),
    store: text(),
    note: text(),
  }),
};

/** A site (makeSite) with a second context in trench A and a second class, so a find can move between them. */
export async function makeUpdateSite(): Promise<UpdateFixture> {
  const fx = await makeSite();
  const db = await getDb();
  const [ctx] = await db
    .insert(schema.contexts)
    .values({ siteId: fx.site.id, trenchId: fx.trench.id, number: 400_000 + unique(), type: "deposit" })
    .returning();
  const [cls] = await db
    .insert(schema.artefactClasses)
    .values({ siteId: fx.site.id, code: `ALT${unique()}`, label: "Burnt bone", colour: "#d55e00", symbol: "square" })
    .returning();
  return { ...fx, alt: { contextId: ctx.id, classId: cls.id } };
}

updatables.recordPhotoUpdate = {
  mod: recordPhotoRoute,
  target: async (fx) => {
    const db = await getDb();
    const n = unique();
    const [p] = await db
      .insert(schema.photos)
      .values({
        siteId: fx.site.id,
        kind: "record",
        contextId: fx.context.id,
        number: 800_000 + n,
        scale: "1 m",
        fileKey: `updatable-record-photo-${fx.site.id}-${n}`,
        fileName: `photo-${n}.jpg`,
        mimeType: "image/jpeg",
      })
      .returning();
    return { params: { siteId: fx.site.id, photoId: p!.id }, read: () => rowOf(schema.photos, p!.id) };
  },
  fields: (fx) => ({
    facing: fc.constantFrom(null, 0, 45, 90, 135, 200, 359),
    scale: fc.constantFrom("none", "1 m", "2 m", "50 cm"),
    caption: text(),
    takenBy: fc.constantFrom(null, fx.people.digger.id, fx.people.director.id),
  }),
};
