import "server-only";
import { and, eq, sql } from "drizzle-orm";
import type { Db } from "@/db/client";
import { artefactClasses, finds } from "@/db/schema";

/** Finds in classes flagged as human remains, on a site or one trench. */
export async function countHumanRemains(db: Db, siteId: string, trenchId?: string): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(finds)
    .innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId))
    .where(and(eq(finds.siteId, siteId), eq(artefactClasses.humanRemains, true), trenchId ? eq(finds.trenchId, trenchId) : undefined));
  return row?.n ?? 0;
}
