import "server-only";
import { asc, count, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { contexts, finds, trenches } from "@/db/schema";
import { readingFrom, readingLabels } from "@/lib/schemas/relation";
import { listRelations } from "@/lib/server/relations";
import type { ContextExportRow } from "./csv";

/** Every context of the site with its trench code, number of finds and relations read from its side. */
export async function contextsForExport(db: Db, siteId: string): Promise<ContextExportRow[]> {
  const [rows, counts, rels] = await Promise.all([
    db
      .select({ c: contexts, trenchCode: trenches.code })
      .from(contexts)
      .innerJoin(trenches, eq(trenches.id, contexts.trenchId))
      .where(eq(contexts.siteId, siteId))
      .orderBy(asc(contexts.number)),
    db.select({ id: finds.contextId, n: count() }).from(finds).where(eq(finds.siteId, siteId)).groupBy(finds.contextId),
    listRelations(db, siteId),
  ]);
  const numbers = new Map(rows.map((r) => [r.c.id, r.c.number]));
  const found = new Map(counts.map((r) => [r.id, Number(r.n)]));
  return rows.map(({ c, trenchCode }) => {
    const readings = rels
      .filter((r) => r.fromId === c.id || r.toId === c.id)
      .map((r) => readingFrom(r, c.id))
      .map((r) => `${readingLabels[r.reading]} ${numbers.get(r.otherId)}`)
      .sort();
    return { ...c, trenchCode, finds: found.get(c.id) ?? 0, relations: readings.join("; ") };
  });
}
