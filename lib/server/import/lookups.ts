import "server-only";
import { eq } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { Db, Tx } from "@/db/client";
import { artefactClasses, contexts, finds, sites, trenches, users } from "@/db/schema";
import { checkOutline } from "@/lib/geometry/outline";
import type { Window } from "@/lib/spatial";

export type ImportContext = { id: string; number: number; trenchId: string; state: string; signedOffBy: string | null; signedOffAt: Date | null; submittedBy: string | null; submittedAt: Date | null };
export type TrenchWindow = { code: string; window: Window | null; problem?: string };

/** Everything a row is checked against, read once per file so 50,000 rows cost one pass in memory. */
export type ImportLookups = {
  classes: Map<string, string>;
  contexts: Map<number, ImportContext>;
  trenches: Map<string, TrenchWindow>;
  usedNumbers: Set<number>;
  nextNumber: number;
};

const submitter = alias(users, "submitter");

export async function loadImportLookups(db: Db | Tx, siteId: string): Promise<ImportLookups> {
  const [site] = await db.select({ next: sites.nextFindNumber }).from(sites).where(eq(sites.id, siteId));
  // One query after another: inside a transaction they share one connection (node-postgres queues
  // concurrent queries on a client, and warns that it will stop doing so).
  const cls = await db.select({ id: artefactClasses.id, code: artefactClasses.code }).from(artefactClasses).where(eq(artefactClasses.siteId, siteId));
  const ctx = await db
    .select({ id: contexts.id, number: contexts.number, trenchId: contexts.trenchId, state: contexts.state, signedOffBy: users.name, signedOffAt: contexts.signedOffAt, submittedBy: submitter.name, submittedAt: contexts.submittedAt })
    .from(contexts)
    .leftJoin(users, eq(users.id, contexts.signedOffBy))
    .leftJoin(submitter, eq(submitter.id, contexts.submittedBy))
    .where(eq(contexts.siteId, siteId));
  const tr = await db.select({ id: trenches.id, code: trenches.code, outline: trenches.outline }).from(trenches).where(eq(trenches.siteId, siteId));
  const nums = await db.select({ n: finds.number }).from(finds).where(eq(finds.siteId, siteId));
  const windows = new Map<string, TrenchWindow>();
  for (const t of tr) {
    // Each trench window is built once here, not once per row.
    const check = checkOutline(t.outline);
    windows.set(t.id, check.ok ? { code: t.code, window: check.window } : { code: t.code, window: null, problem: check.reason });
  }
  return {
    classes: new Map(cls.map((c) => [c.code.toUpperCase(), c.id])),
    contexts: new Map(ctx.map((c) => [c.number, c])),
    trenches: windows,
    usedNumbers: new Set(nums.map((r) => r.n)),
    nextNumber: site?.next ?? 1,
  };
}
