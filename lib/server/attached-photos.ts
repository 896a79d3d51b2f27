import "server-only";
import { count, inArray } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { photos } from "@/db/schema";
import { countOf } from "@/lib/words/count";

/**
 * Photos of the photo register keep their find or context: a record with photos is not deleted, and the
 * refusal says how many photos hold it and what to do, rather than that "other records refer to it".
 */
export async function photosOf(tx: Db | Tx, subject: "find" | "context", ids: string[]): Promise<Map<string, number>> {
  if (!ids.length) return new Map();
  const column = subject === "find" ? photos.findId : photos.contextId;
  const rows = await tx.select({ id: column, n: count() }).from(photos).where(inArray(column, ids)).groupBy(column);
  return new Map(rows.flatMap((r) => (r.id ? [[r.id, r.n] as const] : [])));
}

/** "it has 2 photos in the photo register; delete those photos there first (each with a reason), or keep it". */
export function photosHoldIt(n: number): string {
  const them = n === 1 ? "that photo there first (with a reason)" : "those photos there first (each with a reason)";
  return `it has ${countOf(n, "photo")} in the photo register; delete ${them}, or keep it`;
}
