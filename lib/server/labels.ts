import "server-only";
import { and, asc, eq, gte, inArray, lte, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { Db } from "@/db/client";
import { artefactClasses, boxes, contexts, finds, samples, sites, trenches, users, type Site } from "@/db/schema";
import { boxContents } from "./boxes";
import { labelCode, type LabelKindLetter, type LabelRef } from "@/lib/labels/code";
import { MAX_LABELS, type LabelSelection } from "@/lib/schemas/labels";
import { sampleTypeLabels } from "@/lib/schemas/sample";
import { notFound } from "./errors";
import { isUuid } from "@/lib/schemas/common";
import { loadSiteActor } from "./membership";

/** One label as printed: what it says and the code its QR holds. */
export type LabelItem = {
  key: string;
  kindWord: "Find" | "Sample" | "Box";
  number: number;
  trenchCode: string;
  contextNumber: number;
  what: string;
  date: string;
  recorder: string;
  code: string;
  /** A box label lists what is in the box: one line a find or sample (number, class or type, context). */
  contents?: string[];
};

const taker = alias(users, "label_taker");

/** The labels a selection covers, in number order, with the site's address in front of each code when set. */
export async function labelItems(
  db: Db,
  site: Site,
  q: LabelSelection,
): Promise<{ items: LabelItem[]; truncated: boolean }> {
  const address = site.labelAddress;
  const code = (kind: LabelKindLetter, number: number) => labelCode({ siteCode: site.code, kind, number }, address);
  if (q.kind === "boxes") return boxLabels(db, site, q, code);
  if (q.kind === "finds") {
    const where: SQL[] = [eq(finds.siteId, site.id)];
    if (q.trenchId) where.push(eq(finds.trenchId, q.trenchId));
    if (q.contextId) where.push(eq(finds.contextId, q.contextId));
    if (q.fromNumber) where.push(gte(finds.number, q.fromNumber));
    if (q.toNumber) where.push(lte(finds.number, q.toNumber));
    if (q.ids) where.push(q.ids.length ? inArray(finds.id, q.ids) : sql`false`);
    const rows = await db
      .select({
        id: finds.id,
        number: finds.number,
        trenchCode: trenches.code,
        contextNumber: contexts.number,
        classCode: artefactClasses.code,
        classLabel: artefactClasses.label,
        at: finds.recordedAt,
        recorder: users.name,
      })
      .from(finds)
      .innerJoin(contexts, eq(contexts.id, finds.contextId))
      .innerJoin(trenches, eq(trenches.id, finds.trenchId))
      .innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId))
      .leftJoin(users, eq(users.id, finds.recordedBy))
      .where(and(...where))
      .orderBy(asc(finds.number))
      .limit(MAX_LABELS + 1);
    return {
      truncated: rows.length > MAX_LABELS,
      items: rows.slice(0, MAX_LABELS).map((r) => ({
        key: r.id,
        kindWord: "Find",
        number: r.number,
        trenchCode: r.trenchCode,
        contextNumber: r.contextNumber,
        what: `${r.classCode} · ${r.classLabel}`,
        date: r.at.toISOString().slice(0, 10),
        recorder: r.recorder ?? "",
        code: code("F", r.number),
      })),
    };
  }
  const where: SQL[] = [eq(samples.siteId, site.id)];
  if (q.trenchId) where.push(eq(samples.trenchId, q.trenchId));
  if (q.contextId) where.push(eq(samples.contextId, q.contextId));
  if (q.fromNumber) where.push(gte(samples.number, q.fromNumber));
  if (q.toNumber) where.push(lte(samples.number, q.toNumber));
  if (q.ids) where.push(q.ids.length ? inArray(samples.id, q.ids) : sql`false`);
  const rows = await db
    .select({
      id: samples.id,
      number: samples.number,
      trenchCode: trenches.code,
      contextNumber: contexts.number,
      type: samples.type,
      volumeL: samples.volumeL,
      takenOn: samples.takenOn,
      taker: taker.name,
    })
    .from(samples)
    .innerJoin(contexts, eq(contexts.id, samples.contextId))
    .innerJoin(trenches, eq(trenches.id, samples.trenchId))
    .leftJoin(taker, eq(taker.id, samples.takenBy))
    .where(and(...where))
    .orderBy(asc(samples.number))
    .limit(MAX_LABELS + 1);
  return {
    truncated: rows.length > MAX_LABELS,
    items: rows.slice(0, MAX_LABELS).map((r) => ({
      key: r.id,
      kindWord: "Sample",
      number: r.number,
      trenchCode: r.trenchCode,
      contextNumber: r.contextNumber,
      what: `${sampleTypeLabels[r.type]}${r.volumeL ? ` · ${r.volumeL} l` : ""}`,
      date: r.takenOn,
      recorder: r.taker ?? "",
      code: code("S", r.number),
    })),
  };
}

/** Box labels: the box, its store, and every find and sample in it, in number order. */
async function boxLabels(
  db: Db,
  site: Site,
  q: LabelSelection,
  code: (kind: LabelKindLetter, number: number) => string,
): Promise<{ items: LabelItem[]; truncated: boolean }> {
  const where: SQL[] = [eq(boxes.siteId, site.id)];
  if (q.fromNumber) where.push(gte(boxes.number, q.fromNumber));
  if (q.toNumber) where.push(lte(boxes.number, q.toNumber));
  if (q.ids) where.push(q.ids.length ? inArray(boxes.id, q.ids) : sql`false`);
  const rows = await db
    .select()
    .from(boxes)
    .where(and(...where))
    .orderBy(asc(boxes.number))
    .limit(MAX_LABELS + 1);
  const items: LabelItem[] = [];
  for (const box of rows.slice(0, MAX_LABELS)) {
    const inside = await boxContents(db, box);
    items.push({
      key: box.id,
      kindWord: "Box",
      number: box.number,
      trenchCode: [...new Set([...inside.finds, ...inside.samples].map((r) => r.trenchCode))].join(", "),
      contextNumber: 0,
      what: box.store,
      date: box.updatedAt.toISOString().slice(0, 10),
      recorder: "",
      code: code("B", box.number),
      contents: [
        ...inside.finds.map((f) => `F${f.number} ${f.classCode} · ctx ${f.contextNumber}`),
        ...inside.samples.map((s) => `S${s.number} ${s.typeLabel} · ctx ${s.contextNumber}`),
      ],
    });
  }
  return { items, truncated: rows.length > MAX_LABELS };
}

/**
 * Where a scanned label leads: the record's page, for a member of its site. A stranger, an unknown site code
 * or a number with no record (deleted, or never used) all get the same "not found", revealing nothing.
 */
export async function resolveLabel(db: Db, userId: string, ref: LabelRef): Promise<string> {
  const [site] = await db
    .select({ id: sites.id })
    .from(sites)
    .where(sql`lower(${sites.code}) = lower(${ref.siteCode})`);
  if (!site) throw notFound("That label's record");
  await loadSiteActor(db, userId, site.id).catch(() => {
    throw notFound("That label's record");
  });
  const table = { F: finds, S: samples, B: boxes }[ref.kind];
  const [row] = await db
    .select({ id: table.id })
    .from(table)
    .where(and(eq(table.siteId, site.id), eq(table.number, ref.number)));
  if (!row || !isUuid(row.id)) throw notFound("That label's record");
  return `/sites/${site.id}/${{ F: "finds", S: "samples", B: "boxes" }[ref.kind]}/${row.id}`;
}
