import "server-only";
import { eq, sql } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { sites } from "@/db/schema";
import { MAX_FIND_NUMBER } from "@/lib/schemas/find";
import { conflict } from "./errors";

const maxWords = MAX_FIND_NUMBER.toLocaleString("en-GB");

/**
 * Hands out the next find numbers of a site inside the caller's transaction. The UPDATE takes the site
 * row's lock, so concurrent recorders queue; a rolled-back transaction gives its numbers back, so the
 * sequence has no gaps, and a deleted find's number is never handed out again. Numbers never pass
 * MAX_FIND_NUMBER: when the site has fewer than `howMany` left, nothing is handed out and the refusal says so
 * (the sum is taken in 64 bits, so even a counter written before the bound existed cannot overflow).
 */
export async function allocateFindNumbers(tx: Tx, siteId: string, howMany = 1): Promise<number> {
  const [row] = await tx
    .update(sites)
    .set({ nextFindNumber: sql`${sites.nextFindNumber} + ${howMany}` })
    .where(sql`${sites.id} = ${siteId} and ${sites.nextFindNumber}::bigint + ${howMany} - 1 <= ${MAX_FIND_NUMBER}`)
    .returning({ next: sites.nextFindNumber });
  if (row) return row.next - howMany;
  const [site] = await tx.select({ next: sites.nextFindNumber }).from(sites).where(eq(sites.id, siteId));
  const left = site ? Math.max(0, MAX_FIND_NUMBER - site.next + 1) : 0;
  throw conflict(
    `This site's find numbers are used up: find numbers go up to ${maxWords}, and ${left === 0 ? "none is" : `only ${left.toLocaleString("en-GB")} are`} left for ${howMany === 1 ? "a new find" : `${howMany.toLocaleString("en-GB")} new finds`}.`,
    { left },
  );
}

/**
 * Marks every number up to `highest` as handed out, after an import brought its own numbers (from the
 * total station's point ids). Never lowers the counter, so no number can come round again. `highest` is at
 * most MAX_FIND_NUMBER (the import refuses larger ones), so the counter stays within its column.
 */
export async function reserveFindNumbersThrough(tx: Tx, siteId: string, highest: number): Promise<void> {
  if (!Number.isInteger(highest) || highest > MAX_FIND_NUMBER)
    throw new Error(`find number ${highest} is beyond ${MAX_FIND_NUMBER}`);
  await tx
    .update(sites)
    .set({ nextFindNumber: sql`greatest(${sites.nextFindNumber}, ${highest + 1})` })
    .where(eq(sites.id, siteId));
}

/** Takes the site row's lock for the rest of the transaction, so numbering and imports queue behind it. */
export async function lockSiteNumbers(tx: Tx, siteId: string): Promise<void> {
  await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, siteId)).for("update");
}
