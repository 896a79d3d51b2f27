import "server-only";
import { and, desc, eq, type SQL } from "drizzle-orm";
import type { Db } from "@/db/client";
import { auditEntries, users } from "@/db/schema";

/** Audit entries of a site, newest first, optionally of one record or one person. */
export async function listAudit(db: Db, siteId: string, filter: { recordType?: string; recordId?: string; actorId?: string; limit?: number } = {}) {
  const where: SQL[] = [eq(auditEntries.siteId, siteId)];
  if (filter.recordType) where.push(eq(auditEntries.recordType, filter.recordType));
  if (filter.recordId) where.push(eq(auditEntries.recordId, filter.recordId));
  if (filter.actorId) where.push(eq(auditEntries.actorId, filter.actorId));
  return db
    .select({ id: auditEntries.id, at: auditEntries.at, action: auditEntries.action, recordType: auditEntries.recordType, recordId: auditEntries.recordId, before: auditEntries.before, after: auditEntries.after, reason: auditEntries.reason, actor: users.name })
    .from(auditEntries)
    .leftJoin(users, eq(users.id, auditEntries.actorId))
    .where(and(...where))
    .orderBy(desc(auditEntries.id))
    .limit(filter.limit ?? 200);
}
