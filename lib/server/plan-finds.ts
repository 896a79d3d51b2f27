import "server-only";
import type { Db } from "@/db/client";
import { allFinds } from "./finds";

/**
 * Every find of one trench for the plan's first paint, through the register's own query (all of a trench,
 * in number order, no paging): the plan seeds its client cache with these rows instead of fetching pages
 * after hydration.
 */
export async function listPlanFinds(db: Db, siteId: string, trenchId: string) {
  const rows = await allFinds(db, siteId, { trenchId, sort: "number", dir: "asc" });
  return rows.map((r) => ({ ...r, recordedAt: r.recordedAt.toISOString() }));
}
