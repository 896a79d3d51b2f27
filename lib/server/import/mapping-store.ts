import "server-only";
import { eq } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { importMappings } from "@/db/schema";
import { importMappingSchema, type ImportMapping } from "@/lib/schemas/import";
import { recordAudit } from "@/lib/server/audit";
import type { SiteActor } from "@/lib/server/membership";

/** The site's remembered column mapping, or null when it has never imported. */
export async function getImportMapping(db: Db | Tx, siteId: string): Promise<ImportMapping | null> {
  const [row] = await db.select().from(importMappings).where(eq(importMappings.siteId, siteId));
  if (!row) return null;
  const parsed = importMappingSchema.safeParse(row.mapping);
  return parsed.success ? parsed.data : null;
}

/** Remembers the mapping for the next file, audited; does nothing when it has not changed. */
export async function saveImportMapping(tx: Tx, actor: SiteActor, mapping: ImportMapping): Promise<boolean> {
  const before = await getImportMapping(tx, actor.site.id);
  const clean = Object.fromEntries(Object.entries(mapping).filter(([, v]) => v)) as Record<string, string>;
  if (before && JSON.stringify(sorted(before)) === JSON.stringify(sorted(clean))) return false;
  await tx
    .insert(importMappings)
    .values({ siteId: actor.site.id, mapping: clean })
    .onConflictDoUpdate({ target: importMappings.siteId, set: { mapping: clean, updatedAt: new Date() } });
  await recordAudit(tx, {
    siteId: actor.site.id,
    actorId: actor.userId,
    action: "map-columns",
    recordType: "import",
    recordId: actor.site.id,
    before,
    after: clean,
  });
  return true;
}

const sorted = (m: Record<string, string | undefined>) =>
  Object.fromEntries(
    Object.entries(m)
      .filter(([, v]) => v)
      .sort(([a], [b]) => a.localeCompare(b)),
  );
