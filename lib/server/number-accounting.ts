import "server-only";
import { and, asc, eq, isNull, max, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { Db, Tx } from "@/db/client";
import {
  auditEntries,
  contexts,
  finds,
  numberBlocks,
  numberVoids,
  samples,
  sites,
  users,
  type NumberKind,
} from "@/db/schema";
import { runsOf } from "./number-blocks";

/**
 * The accounting of a site's numbers (field.md, "Numbers"): every number from 1 to the highest handed out
 * is exactly one of
 * - `find` (or `context`): a record carries it;
 * - `sample`: a sample carries it, where the site's samples share the finds' sequence;
 * - `reserved`: free in a block held by a named user on a named device;
 * - `void`: given up for good — a block given back, a record deleted — with the reason and who;
 * - `unassigned`: never handed out (a context number nobody typed; find numbers skipped when an import
 *   brought its own, higher numbers).
 * Consecutive numbers of one status and one holder or reason form one range, so a register of thousands of
 * finds prints in a few lines. More sequences sharing the numbers (another register) add a source below.
 */

export type NumberStatus = "find" | "sample" | "context" | "reserved" | "void" | "unassigned";

export type NumberRange = {
  first: number;
  last: number;
  status: NumberStatus;
  /** reserved: the block, its device and holder. */
  blockId?: string;
  deviceId?: string;
  deviceLabel?: string;
  holder?: string | null;
  /** void: why, who held the numbers, who made them void. */
  reason?: string;
  by?: string | null;
};

export type NumberAccounting = {
  kind: NumberKind;
  highest: number;
  totals: Record<NumberStatus, number>;
  ranges: NumberRange[];
  /** Numbers that fall under two statuses at once (should never happen; listed so it is seen, not hidden). */
  overlaps: number[];
};

/** Numbers carried by records of the sequence, each with its status, lowest first. */
async function recordNumbers(
  db: Db | Tx,
  siteId: string,
  kind: NumberKind,
): Promise<{ n: number; status: NumberStatus }[]> {
  if (kind === "context") {
    const rows = await db
      .select({ n: contexts.number })
      .from(contexts)
      .where(eq(contexts.siteId, siteId))
      .orderBy(asc(contexts.number));
    return rows.map((r) => ({ n: r.n, status: "context" as const }));
  }
  const out: { n: number; status: NumberStatus }[] = (
    await db.select({ n: finds.number }).from(finds).where(eq(finds.siteId, siteId))
  ).map((r) => ({ n: r.n, status: "find" as const }));
  const [site] = await db.select({ shared: sites.samplesShareFindNumbers }).from(sites).where(eq(sites.id, siteId));
  if (site?.shared)
    for (const r of await db.select({ n: samples.number }).from(samples).where(eq(samples.siteId, siteId)))
      out.push({ n: r.n, status: "sample" });
  return out.sort((a, b) => a.n - b.n);
}

async function highestOf(db: Db | Tx, siteId: string, kind: NumberKind, records: { n: number }[]): Promise<number> {
  const [b] = await db
    .select({ n: max(numberBlocks.last) })
    .from(numberBlocks)
    .where(and(eq(numberBlocks.siteId, siteId), eq(numberBlocks.kind, kind)));
  const [v] = await db
    .select({ n: max(numberVoids.last) })
    .from(numberVoids)
    .where(and(eq(numberVoids.siteId, siteId), eq(numberVoids.kind, kind)));
  let counter = 0;
  if (kind === "find") {
    const [s] = await db.select({ next: sites.nextFindNumber }).from(sites).where(eq(sites.id, siteId));
    counter = (s?.next ?? 1) - 1;
  }
  return Math.max(counter, b?.n ?? 0, v?.n ?? 0, records.length ? records[records.length - 1]!.n : 0);
}

export async function accountNumbers(db: Db | Tx, siteId: string, kind: NumberKind): Promise<NumberAccounting> {
  const records = await recordNumbers(db, siteId, kind);
  const highest = await highestOf(db, siteId, kind, records);
  const ranges: NumberRange[] = [];

  // Records: runs of one status.
  let i = 0;
  while (i < records.length) {
    const start = records[i]!;
    let end = start.n;
    while (i + 1 < records.length && records[i + 1]!.n === end + 1 && records[i + 1]!.status === start.status)
      end = records[++i]!.n;
    ranges.push({ first: start.n, last: end, status: start.status });
    i++;
  }
  const taken = new Set(records.map((r) => r.n));

  // Void numbers, with the reason and who.
  const holder = alias(users, "holder");
  const voider = alias(users, "voider");
  const voids = await db
    .select({
      first: numberVoids.first,
      last: numberVoids.last,
      reason: numberVoids.reason,
      heldBy: holder.name,
      by: voider.name,
    })
    .from(numberVoids)
    .leftJoin(holder, eq(holder.id, numberVoids.heldBy))
    .leftJoin(voider, eq(voider.id, numberVoids.voidedBy))
    .where(and(eq(numberVoids.siteId, siteId), eq(numberVoids.kind, kind)));
  for (const v of voids) {
    ranges.push({ first: v.first, last: v.last, status: "void", reason: v.reason, holder: v.heldBy, by: v.by });
    for (let n = v.first; n <= v.last; n++) taken.add(n);
  }

  // Open blocks: their numbers not yet used are reserved for the holder's device.
  const blocks = await db
    .select({
      id: numberBlocks.id,
      first: numberBlocks.first,
      last: numberBlocks.last,
      deviceId: numberBlocks.deviceId,
      deviceLabel: numberBlocks.deviceLabel,
      holder: users.name,
    })
    .from(numberBlocks)
    .leftJoin(users, eq(users.id, numberBlocks.userId))
    .where(and(eq(numberBlocks.siteId, siteId), eq(numberBlocks.kind, kind), isNull(numberBlocks.releasedAt)));
  for (const b of blocks) {
    const free: number[] = [];
    for (let n = b.first; n <= b.last; n++) if (!taken.has(n)) free.push(n);
    for (const [first, last] of runsOf(free))
      ranges.push({
        first,
        last,
        status: "reserved",
        blockId: b.id,
        deviceId: b.deviceId,
        deviceLabel: b.deviceLabel,
        holder: b.holder,
      });
    for (const n of free) taken.add(n);
  }

  // Finds deleted before deletions were recorded as void: their numbers are found on the audit trail.
  if (kind === "find") {
    const deleted = await db
      .select({ n: sql<number>`(${auditEntries.before}->>'number')::int`, by: users.name })
      .from(auditEntries)
      .leftJoin(users, eq(users.id, auditEntries.actorId))
      .where(
        and(eq(auditEntries.siteId, siteId), eq(auditEntries.recordType, "find"), eq(auditEntries.action, "delete")),
      );
    for (const d of deleted) {
      if (d.n == null || taken.has(d.n)) continue;
      ranges.push({ first: d.n, last: d.n, status: "void", reason: "find deleted", by: d.by });
      taken.add(d.n);
    }
  }

  ranges.sort((a, b) => a.first - b.first || a.last - b.last);
  // Gaps below the highest: never handed out.
  const filled: NumberRange[] = [];
  const overlaps: number[] = [];
  let next = 1;
  for (const r of ranges) {
    if (r.first > next) filled.push({ first: next, last: r.first - 1, status: "unassigned" });
    else if (r.first < next) for (let n = r.first; n < Math.min(next, r.last + 1); n++) overlaps.push(n);
    filled.push(r);
    next = Math.max(next, r.last + 1);
  }
  if (next <= highest) filled.push({ first: next, last: highest, status: "unassigned" });

  const totals: Record<NumberStatus, number> = { find: 0, sample: 0, context: 0, reserved: 0, void: 0, unassigned: 0 };
  for (const r of filled) totals[r.status] += r.last - r.first + 1;
  return { kind, highest, totals, ranges: filled, overlaps };
}
