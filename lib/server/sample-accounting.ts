import "server-only";
import { and, eq, sql } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { auditEntries, samples, sites, users } from "@/db/schema";
import { accountNumbers, type NumberRange, type NumberStatus } from "./number-accounting";

/** Which sequence an accounting covers: samples in their own sequence are accounted apart from the finds'. */
export type AccountedSequence = "find" | "context" | "sample";

export type SequenceAccounting = {
  sequence: AccountedSequence;
  highest: number;
  totals: Record<NumberStatus, number>;
  ranges: NumberRange[];
  overlaps: number[];
};

const emptyTotals = (): Record<NumberStatus, number> => ({
  find: 0,
  sample: 0,
  context: 0,
  reserved: 0,
  void: 0,
  unassigned: 0,
});

/**
 * The accounting of a site's sample numbers (field.md, "Numbers"). Where samples share the finds' sequence it
 * is that sequence's accounting (finds and samples side by side). Otherwise samples have their own sequence,
 * handed out one at a time on the server and never reserved in blocks: every number up to the highest handed
 * out is a sample, void because its sample was deleted (the reason read from the audit trail), or — should a
 * number ever be missing without a deletion — not handed out, so the gap shows rather than hides.
 */
export async function accountSampleNumbers(db: Db | Tx, siteId: string): Promise<SequenceAccounting> {
  const [site] = await db
    .select({ shared: sites.samplesShareFindNumbers, next: sites.nextSampleNumber })
    .from(sites)
    .where(eq(sites.id, siteId));
  if (site?.shared) {
    const { kind, ...rest } = await accountNumbers(db, siteId, "find");
    return { sequence: kind, ...rest };
  }
  const used = (await db.select({ n: samples.number }).from(samples).where(eq(samples.siteId, siteId))).map((r) => r.n);
  const deleted = await db
    .select({
      n: sql<number | null>`(${auditEntries.before}->>'number')::int`,
      reason: auditEntries.reason,
      by: users.name,
    })
    .from(auditEntries)
    .leftJoin(users, eq(users.id, auditEntries.actorId))
    .where(
      and(eq(auditEntries.siteId, siteId), eq(auditEntries.recordType, "sample"), eq(auditEntries.action, "delete")),
    );
  const status = new Map<number, NumberRange>();
  for (const n of used) status.set(n, { first: n, last: n, status: "sample" });
  const overlaps: number[] = [];
  for (const d of deleted) {
    if (d.n == null) continue;
    if (status.has(d.n)) {
      overlaps.push(d.n);
      continue;
    }
    status.set(d.n, {
      first: d.n,
      last: d.n,
      status: "void",
      reason: `sample deleted${d.reason ? `: ${d.reason}` : ""}`,
      by: d.by,
    });
  }
  const highest = Math.max((site?.next ?? 1) - 1, ...status.keys(), 0);
  const ranges: NumberRange[] = [];
  for (let n = 1; n <= highest; n++) {
    const r = status.get(n) ?? { first: n, last: n, status: "unassigned" as const };
    const prev = ranges[ranges.length - 1];
    // Runs of samples or of never-handed-out numbers print as one line; each void number keeps its reason.
    if (prev && prev.last === n - 1 && prev.status === r.status && r.status !== "void") prev.last = n;
    else ranges.push({ ...r });
  }
  const totals = emptyTotals();
  for (const r of ranges) totals[r.status] += r.last - r.first + 1;
  return { sequence: "sample", highest, totals, ranges, overlaps };
}

/** The finds' or the contexts' accounting in the same shape as the samples'. */
export async function accountSequence(
  db: Db | Tx,
  siteId: string,
  sequence: AccountedSequence,
): Promise<SequenceAccounting> {
  if (sequence === "sample") return accountSampleNumbers(db, siteId);
  const { kind, ...rest } = await accountNumbers(db, siteId, sequence);
  return { sequence: kind, ...rest };
}
