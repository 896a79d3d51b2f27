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

/**
 * Marks every number up to `highest` as handed out, after an import brought its own numbers (from the
 * total station's point ids). Never lowers the counter, so no number can come round again.
 */
export async function reserveFindNumbersThrough(tx: Tx, siteId: string, highest: number): Promise<void> {
  await tx
    .update(sites)
    .set({ nextFindNumber: sql`greatest(${sites.nextFindNumber}, ${highest + 1})` })
    .where(eq(sites.id, siteId));
}

/** Takes the site row's lock for the rest of the transaction, so numbering and imports queue behind it. */
export async function lockSiteNumbers(tx: Tx, siteId: string): Promise<void> {
  await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, siteId)).for("update");
}
