import { randomUUID } from "node:crypto";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import type { SiteFixture } from "../../support/fixtures";
import type { RoleCases } from "./types";
import * as blocksRoute from "@/app/api/sites/[siteId]/number-blocks/route";
import * as releaseRoute from "@/app/api/sites/[siteId]/number-blocks/[blockId]/release/route";
import * as discardsRoute from "@/app/api/sites/[siteId]/discards/route";

/** A block of find numbers 900001–900010 held by `holder` on a tablet (arranged directly, not through the rule). */
export async function heldBlock(fx: SiteFixture, holder: string) {
  const db = await getDb();
  const [b] = await db
    .insert(schema.numberBlocks)
    .values({
      siteId: fx.site.id,
      kind: "find",
      first: 900_001,
      last: 900_010,
      userId: holder,
      deviceId: randomUUID(),
      deviceLabel: "Tablet 2",
    })
    .returning();
  return b!;
}

export const offlineCases: RoleCases = {
  numberBlocksCreate: async (fx) => ({
    mod: blocksRoute,
    params: { siteId: fx.site.id },
    body: { kind: "find", deviceId: randomUUID(), deviceLabel: "Trench tablet" },
  }),
  // Held by the digger: the holder gives it back, or a director does (a lost tablet).
  numberBlockRelease: async (fx) => {
    const b = await heldBlock(fx, fx.people.digger.id);
    return { mod: releaseRoute, params: { siteId: fx.site.id, blockId: b.id }, body: { reason: "End of the season" } };
  },
  discardsCreate: async (fx) => ({
    mod: discardsRoute,
    params: { siteId: fx.site.id },
    body: {
      idempotencyKey: randomUUID(),
      operation: "findsCreate",
      method: "POST",
      path: `/api/sites/${fx.site.id}/finds`,
      reasonCode: "locked",
      reason: "Context 1001 was signed off.",
      body: { x: 1, y: 1 },
    },
  }),
};
