import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { artefactClasses, contexts, finds, users } from "@/db/schema";

/**
 * Every find of one trench for the plan's first paint, in one lean query (no paging, no window count):
 * the plan seeds its client cache with these rows instead of fetching 500-row pages after hydration.
 */
export async function listPlanFinds(db: Db, siteId: string, trenchId: string) {
  const rows = await db
    .select({
      id: finds.id,
      number: finds.number,
      x: finds.x,
      y: finds.y,
      z: finds.z,
      count: finds.count,
      weightG: finds.weightG,
      description: finds.description,
      method: finds.method,
      recordedAt: finds.recordedAt,
      recordedBy: users.name,
      trenchId: finds.trenchId,
      contextId: finds.contextId,
      contextNumber: contexts.number,
      contextState: contexts.state,
      classId: finds.classId,
      classCode: artefactClasses.code,
      classLabel: artefactClasses.label,
    })
    .from(finds)
    .innerJoin(contexts, eq(contexts.id, finds.contextId))
    .innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId))
    .leftJoin(users, eq(users.id, finds.recordedBy))
    .where(and(eq(finds.siteId, siteId), eq(finds.trenchId, trenchId)))
    .orderBy(asc(finds.number));
  return rows.map((r) => ({ ...r, recordedAt: r.recordedAt.toISOString() }));
}
