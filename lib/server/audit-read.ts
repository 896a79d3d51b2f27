import "server-only";
import { and, desc, eq, or, sql, type SQL } from "drizzle-orm";
import type { Db } from "@/db/client";
import { auditEntries, users } from "@/db/schema";

/**
 * Audit entries of a site, newest first, optionally of one record or one person. `sheetOf` gives a context
 * sheet's whole trail: the context's own entries and those of the relations it takes part in.
 */
export async function listAudit(
  db: Db,
  siteId: string,
  filter: { recordType?: string; recordId?: string; actorId?: string; sheetOf?: string; limit?: number } = {},
) {
  const where: SQL[] = [eq(auditEntries.siteId, siteId)];
  if (filter.recordType) where.push(eq(auditEntries.recordType, filter.recordType));
  if (filter.recordId) where.push(eq(auditEntries.recordId, filter.recordId));
  if (filter.sheetOf) {
    const snap = sql`coalesce(${auditEntries.after}, ${auditEntries.before})`;
    where.push(
      or(
        and(eq(auditEntries.recordType, "context"), eq(auditEntries.recordId, filter.sheetOf)),
        and(
          eq(auditEntries.recordType, "relation"),
          or(sql`${snap}->>'fromId' = ${filter.sheetOf}`, sql`${snap}->>'toId' = ${filter.sheetOf}`),
        ),
      )!,
    );
  }
  if (filter.actorId) where.push(eq(auditEntries.actorId, filter.actorId));
  return db
    .select({
      id: auditEntries.id,
      at: auditEntries.at,
      action: auditEntries.action,
      recordType: auditEntries.recordType,
      recordId: auditEntries.recordId,
      before: auditEntries.before,
      after: auditEntries.after,
      reason: auditEntries.reason,
      actor: users.name,
    })
    .from(auditEntries)
    .leftJoin(users, eq(users.id, auditEntries.actorId))
    .where(and(...where))
    .orderBy(desc(auditEntries.id))
    .limit(filter.limit ?? 200);
}
