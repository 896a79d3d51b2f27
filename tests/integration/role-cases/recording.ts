import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import type { SiteFixture } from "../../support/fixtures";
import { nextCount, type RoleCases } from "./types";
import * as relationsRoute from "@/app/api/sites/[siteId]/relations/route";
import * as relationRoute from "@/app/api/sites/[siteId]/relations/[relationId]/route";
import * as importRoute from "@/app/api/sites/[siteId]/import/route";
import * as previewRoute from "@/app/api/sites/[siteId]/import/preview/route";

async function secondContext(fx: SiteFixture) {
  const db = await getDb();
  const [c] = await db
    .insert(schema.contexts)
    .values({ siteId: fx.site.id, trenchId: fx.trench.id, number: 8000 + nextCount(), type: "fill" })
    .returning();
  return c;
}

const csvFor = (fx: SiteFixture) =>
  `x,y,class,context\n1.5,1.5,${fx.cls.code},${fx.context.number}\n2.5,1.0,${fx.cls.code},${fx.context.number}\n`;
const mapping = { x: "x", y: "y", classCode: "class", contextNumber: "context" };

/** Mutating operations of recording: relations and total-station imports. */
export const recordingCases: RoleCases = {
  relationsCreate: async (fx) => {
    const other = await secondContext(fx);
    return {
      mod: relationsRoute,
      params: { siteId: fx.site.id },
      body: { contextId: fx.context.id, reading: "below", otherId: other.id },
    };
  },
  relationDelete: async (fx) => {
    const other = await secondContext(fx);
    const db = await getDb();
    const [r] = await db
      .insert(schema.contextRelations)
      .values({ siteId: fx.site.id, fromId: other.id, toId: fx.context.id, kind: "above" })
      .returning();
    return { mod: relationRoute, params: { siteId: fx.site.id, relationId: r.id } };
  },
  // A preview imports nothing, but remembers the mapping it was given (audited), which is its write.
  importPreview: async (fx) => ({
    mod: previewRoute,
    params: { siteId: fx.site.id },
    body: { csv: csvFor(fx), fileName: "ts.csv", mapping },
  }),
  importCommit: async (fx) => ({
    mod: importRoute,
    params: { siteId: fx.site.id },
    body: { csv: csvFor(fx), fileName: "ts.csv", mapping },
  }),
};
