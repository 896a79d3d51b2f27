import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import type { SiteFixture } from "../../support/fixtures";
import { nextCount, type RoleCases } from "./types";
import * as datumRoute from "@/app/api/sites/[siteId]/datum/route";
import * as benchmarksRoute from "@/app/api/sites/[siteId]/benchmarks/route";
import * as benchmarkRoute from "@/app/api/sites/[siteId]/benchmarks/[benchmarkId]/route";
import * as runsRoute from "@/app/api/sites/[siteId]/level-runs/route";
import * as spitsRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/spits/route";
import * as spitRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/spits/[spitId]/route";
import * as sectionsRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/sections/route";
import * as sectionRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/sections/[sectionId]/route";

export async function makeSection(fx: SiteFixture) {
  const db = await getDb();
  const [s] = await db
    .insert(schema.findSections)
    .values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      name: `S${nextCount()}`,
      startX: 0,
      startY: 0,
      endX: 4,
      endY: 0,
      halfWidth: 0.5,
      exaggeration: 2,
    })
    .returning();
  return s!;
}

export async function makeBenchmark(fx: SiteFixture, level = 50) {
  const db = await getDb();
  const [b] = await db
    .insert(schema.benchmarks)
    .values({ siteId: fx.site.id, code: `TBM ${nextCount()}`, description: "pin", x: 0, y: 0, level })
    .returning();
  return b!;
}

export async function makeSpit(fx: SiteFixture) {
  const db = await getDb();
  const [s] = await db
    .insert(schema.spits)
    .values({ siteId: fx.site.id, contextId: fx.context.id, number: nextCount() })
    .returning();
  return s!;
}

/** Mutating operations of levels: datum, benchmarks, levelling runs, spits and sections of finds. */
export const levelsCases: RoleCases = {
  sectionsCreate: async (fx) => ({
    mod: sectionsRoute,
    params: { siteId: fx.site.id, trenchId: fx.trench.id },
    body: { name: `S${nextCount()}`, startX: 0, startY: 0, endX: 5, endY: 1, halfWidth: 0.4, exaggeration: 2 },
  }),
  sectionDelete: async (fx) => {
    const s = await makeSection(fx);
    return { mod: sectionRoute, params: { siteId: fx.site.id, trenchId: fx.trench.id, sectionId: s.id } };
  },
  datumUpdate: async (fx) => ({
    mod: datumRoute,
    params: { siteId: fx.site.id },
    body: { datumKind: "national", datumName: "National datum", levelTolerance: 0.004 },
  }),
  benchmarksCreate: async (fx) => ({
    mod: benchmarksRoute,
    params: { siteId: fx.site.id },
    body: { code: `TBM ${nextCount()}`, description: "nail", x: 1, y: 2, level: 49.5 },
  }),
  benchmarkUpdate: async (fx) => {
    const b = await makeBenchmark(fx);
    return {
      mod: benchmarkRoute,
      params: { siteId: fx.site.id, benchmarkId: b.id },
      body: { description: "nail in post" },
    };
  },
  benchmarkDelete: async (fx) => {
    const b = await makeBenchmark(fx);
    return { mod: benchmarkRoute, params: { siteId: fx.site.id, benchmarkId: b.id } };
  },
  levelRunsCreate: async (fx) => {
    const b = await makeBenchmark(fx);
    return {
      mod: runsRoute,
      params: { siteId: fx.site.id },
      body: {
        takenOn: "2026-06-10",
        startBenchmarkId: b.id,
        lines: [
          { station: b.code, target: "benchmark", backsight: 1.2 },
          { station: "top", target: "context_top", targetId: fx.context.id, intermediate: 1.5 },
          { station: "CP", target: "change_point", foresight: 1.4 },
        ],
      },
    };
  },
  spitsCreate: async (fx) => ({
    mod: spitsRoute,
    params: { siteId: fx.site.id, contextId: fx.context.id },
    body: { number: nextCount(), topLevel: 49.3, baseLevel: 49.25 },
  }),
  spitUpdate: async (fx) => {
    const s = await makeSpit(fx);
    return {
      mod: spitRoute,
      params: { siteId: fx.site.id, contextId: fx.context.id, spitId: s.id },
      body: { baseLevel: 49.2 },
    };
  },
  spitDelete: async (fx) => {
    const s = await makeSpit(fx);
    return { mod: spitRoute, params: { siteId: fx.site.id, contextId: fx.context.id, spitId: s.id } };
  },
};
