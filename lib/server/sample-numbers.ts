import "server-only";
import { eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { sites } from "@/db/schema";
import { allocateFindNumbers } from "./find-numbers";
import { allocateRegisterNumber } from "./register-numbers";

/**
 * The next sample number of a site, inside the caller's transaction. A site chooses (field.md) whether
 * samples share the finds' sequence — then the number comes from the finds' allocation, under its rules and
 * its bound, so a number is a find or a sample, never both — or have their own, kept the same way: the
 * UPDATE takes the site row's lock, a rolled-back transaction gives its number back, and a deleted sample's
 * number is never handed out again.
 */
export async function allocateSampleNumber(tx: Tx, siteId: string): Promise<number> {
  const [site] = await tx
    .select({ shared: sites.samplesShareFindNumbers })
    .from(sites)
    .where(eq(sites.id, siteId))
    .for("update");
  if (site?.shared) return allocateFindNumbers(tx, siteId, 1);
  return allocateRegisterNumber(tx, siteId, "sample");
}
