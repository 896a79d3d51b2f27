import "server-only";
import { and, eq, sql } from "drizzle-orm";
import type { Db } from "@/db/client";
import { artefactClasses, finds, trenches } from "@/db/schema";

/**
 * The finds in classes flagged as human remains (at most `limit`, lowest numbers first), each with its trench, so a
 * banner can say where.
 */
export async function listHumanRemains(db: Db, siteId: string, trenchId?: string, limit = 20) {
  return db
    .select({ id: finds.id, number: finds.number, trenchId: finds.trenchId, trenchCode: trenches.code })
    .from(finds)
    .innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId))
    .innerJoin(trenches, eq(trenches.id, finds.trenchId))
    .where(
      and(
        eq(finds.siteId, siteId),
        eq(artefactClasses.humanRemains, true),
        trenchId ? eq(finds.trenchId, trenchId) : undefined,
      ),
    )
    .orderBy(finds.number)
    .limit(limit);
}

/** Finds in classes flagged as human remains, on a site or one trench. */
export async function countHumanRemains(db: Db, siteId: string, trenchId?: string): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(finds)
    .innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId))
    .where(
      and(
        eq(finds.siteId, siteId),
        eq(artefactClasses.humanRemains, true),
        trenchId ? eq(finds.trenchId, trenchId) : undefined,
      ),
    );
  return row?.n ?? 0;
}
