import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import type { SiteFixture } from "../../support/fixtures";
import type { RoleCases } from "./types";
import * as squaresRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/squares/route";
import * as squareRecordRoute from "@/app/api/sites/[siteId]/square-records/[sampleId]/route";
import * as squareImportRoute from "@/app/api/sites/[siteId]/square-import/route";

/** Gives the fixture's trench (10 m × 6 m with a baulk at 4–6 × 2–3) a 1 m grid through the site origin. */
export async function gridTrench(fx: SiteFixture, size = 1, originX = 0, originY = 0) {
  const db = await getDb();
  await db
    .update(schema.trenches)
    .set({ squareSize: size, squareOriginX: originX, squareOriginY: originY })
    .where(eq(schema.trenches.id, fx.trench.id));
}

/** A square record of the fixture's context in square (col, row) with one count of the fixture's class. */
export async function makeSquareRecord(fx: SiteFixture, col = 0, row = 0, count = 3) {
  await gridTrench(fx);
  const db = await getDb();
  const [s] = await db
    .insert(schema.squareSamples)
    .values({ siteId: fx.site.id, trenchId: fx.trench.id, contextId: fx.context.id, col, row })
    .returning();
  await db.insert(schema.squareCounts).values({ sampleId: s!.id, classId: fx.cls.id, count });
  return s!;
}

export const squareCsv = (fx: SiteFixture) =>
  `square,context,class,count,weight_g\n1/1,${fx.context.number},${fx.cls.code},12,30.5\n2/1,${fx.context.number},${fx.cls.code},0,\n`;

/** Mutating operations of counts by grid square. */
export const squaresCases: RoleCases = {
  squareRecord: async (fx) => {
    await gridTrench(fx);
    return {
      mod: squaresRoute,
      params: { siteId: fx.site.id, trenchId: fx.trench.id },
      body: { col: 2, row: 4, contextId: fx.context.id, counts: [{ classId: fx.cls.id, count: 7, weightG: 12.5 }] },
    };
  },
  squareDelete: async (fx) => {
    const s = await makeSquareRecord(fx);
    return { mod: squareRecordRoute, params: { siteId: fx.site.id, sampleId: s.id } };
  },
  squareImport: async (fx) => {
    await gridTrench(fx);
    return {
      mod: squareImportRoute,
      params: { siteId: fx.site.id },
      body: { trenchId: fx.trench.id, csv: squareCsv(fx), fileName: "sieve.csv" },
    };
  },
};
