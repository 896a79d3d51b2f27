import "server-only";
import { eq, sql } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { sites } from "@/db/schema";

/**
 * Hands out the next find numbers of a site inside the caller's transaction. The UPDATE takes the site
 * row's lock, so concurrent recorders queue; a rolled-back transaction gives its numbers back, so the
 * sequence has no gaps, and a deleted find's number is never handed out again.
 */
export async function allocateFindNumbers(tx: Tx, siteId: string, howMany = 1): Promise<number> {
  const [row] = await tx
    .update(sites)
    .set({ nextFindNumber: sql`${sites.nextFindNumber} + ${howMany}` })
    .where(eq(sites.id, siteId))
    .returning({ next: sites.nextFindNumber });
  return row.next - howMany;
}
