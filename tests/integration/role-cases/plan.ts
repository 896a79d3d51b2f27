import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import type { SiteFixture } from "../../support/fixtures";
import { nextCount, type RoleCases } from "./types";
import * as photoRoute from "@/app/api/sites/[siteId]/photos/[photoId]/route";
import * as photoFitRoute from "@/app/api/sites/[siteId]/photos/[photoId]/fit/route";

/** A photo record without files: enough for fit (similarity needs no raster) and delete. */
export async function insertPhoto(fx: SiteFixture) {
  const db = await getDb();
  const [p] = await db
    .insert(schema.photos)
    .values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      fileKey: `key-${nextCount()}-${crypto.randomUUID()}`,
      fileName: "plan.jpg",
      mimeType: "image/jpeg",
      width: 1000,
      height: 800,
    })
    .returning();
  return p;
}

export const planCases: RoleCases = {
  photoFit: async (fx) => {
    const p = await insertPhoto(fx);
    return {
      mod: photoFitRoute,
      params: { siteId: fx.site.id, photoId: p.id },
      body: {
        points: [
          { px: 0, py: 0, x: 0, y: 6 },
          { px: 1000, py: 0, x: 10, y: 6 },
        ],
      },
    };
  },
  photoDelete: async (fx) => {
    const p = await insertPhoto(fx);
    return { mod: photoRoute, params: { siteId: fx.site.id, photoId: p.id } };
  },
};
