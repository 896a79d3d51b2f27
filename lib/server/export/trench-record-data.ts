import "server-only";
import { and, asc, count, desc, eq, inArray, or } from "drizzle-orm";
import type { Db } from "@/db/client";
import {
  artefactClasses,
  auditEntries,
  contextRelations,
  contexts,
  finds,
  users,
  type PolygonJson,
  type Site,
  type Trench,
} from "@/db/schema";
import { readingFrom, readingLabels } from "@/lib/schemas/relation";
import { listClassLooks } from "../artefact-classes";

/**
 * What the trench record in the package shows, read with counts from the database rather than every find:
 * a trench of any size costs the same here (the finds themselves are in registers/finds.csv).
 */
export type TrenchRecord = {
  site: { code: string; name: string; datum: string };
  trench: { code: string; name: string; outline: PolygonJson; surfaceLevel: number | null };
  signOff: { at: Date; by: string; fingerprint: string | null } | null;
  contexts: {
    number: number;
    type: string;
    state: string;
    fields: [label: string, value: string][];
    relations: string[];
    extent: PolygonJson | null;
    signedOff: { at: Date; by: string } | null;
  }[];
  /** Finds by context and class, in context then class order. */
  findCounts: { context: number; classCode: string; classLabel: string; finds: number }[];
  /**
   * Every find's position on the site grid, by class (in class code order), with the class's colour and
   * symbol as the plan shows them: the plan draws them. Packed in typed arrays, 16 bytes a find.
   */
  findPoints: {
    classCode: string;
    classLabel: string;
    colour: string;
    symbol: string;
    x: Float64Array;
    y: Float64Array;
  }[];
  exportedAt: Date;
};

const sheetFields = ["colour", "compaction", "composition", "inclusions", "description", "interpretation"] as const;

export async function readTrenchRecord(db: Db, site: Site, trench: Trench, exportedAt: Date): Promise<TrenchRecord> {
  const sheets = await db.select().from(contexts).where(eq(contexts.trenchId, trench.id)).orderBy(asc(contexts.number));
  const ids = sheets.map((c) => c.id);
  const rels = ids.length
    ? await db
        .select()
        .from(contextRelations)
        .where(or(inArray(contextRelations.fromId, ids), inArray(contextRelations.toId, ids)))
        .orderBy(asc(contextRelations.createdAt))
    : [];
  const numberOf = new Map(sheets.map((c) => [c.id, c.number]));
  const others = rels.flatMap((r) => [r.fromId, r.toId]).filter((id) => !numberOf.has(id));
  if (others.length)
    for (const c of await db
      .select({ id: contexts.id, number: contexts.number })
      .from(contexts)
      .where(inArray(contexts.id, others)))
      numberOf.set(c.id, c.number);
  const people = [trench.signedOffBy, ...sheets.map((c) => c.signedOffBy)].filter((id): id is string => !!id);
  const names = new Map(
    people.length
      ? (await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, people))).map((u) => [
          u.id,
          u.name,
        ])
      : [],
  );
  const counts = await db
    .select({ contextId: finds.contextId, code: artefactClasses.code, label: artefactClasses.label, n: count() })
    .from(finds)
    .innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId))
    .where(eq(finds.trenchId, trench.id))
    .groupBy(finds.contextId, artefactClasses.code, artefactClasses.label);
  const findPoints = await readFindPoints(db, site.id, trench.id);
  // The fingerprint stamped when the trench was last signed off (the sign-off step records it).
  const [stamp] = trench.signedOffAt
    ? await db
        .select({ after: auditEntries.after })
        .from(auditEntries)
        .where(
          and(
            eq(auditEntries.recordType, "trench"),
            eq(auditEntries.recordId, trench.id),
            eq(auditEntries.action, "sign-off"),
          ),
        )
        .orderBy(desc(auditEntries.id))
        .limit(1)
    : [];
  const nameOf = (id: string | null) => (id ? (names.get(id) ?? "unknown") : "unknown");
  return {
    site: { code: site.code, name: site.name, datum: site.datumName },
    trench: { code: trench.code, name: trench.name, outline: trench.outline, surfaceLevel: trench.surfaceLevel },
    signOff: trench.signedOffAt
      ? {
          at: trench.signedOffAt,
          by: nameOf(trench.signedOffBy),
          fingerprint: (stamp?.after as { fingerprint?: string } | null)?.fingerprint ?? null,
        }
      : null,
    contexts: sheets.map((c) => ({
      number: c.number,
      type: c.type,
      state: c.state,
      fields: sheetFields.map((k): [string, string] => [k, c[k]]),
      relations: rels
        .filter((r) => r.fromId === c.id || r.toId === c.id)
        .map((r) => {
          const seen = readingFrom(r, c.id);
          return `${readingLabels[seen.reading]} ${numberOf.get(seen.otherId) ?? "?"}`;
        }),
      extent: c.extent,
      signedOff: c.signedOffAt ? { at: c.signedOffAt, by: nameOf(c.signedOffBy) } : null,
    })),
    findCounts: counts
      .map((r) => ({
        context: numberOf.get(r.contextId) ?? 0,
        classCode: r.code,
        classLabel: r.label,
        finds: Number(r.n),
      }))
      .sort((a, b) => a.context - b.context || a.classCode.localeCompare(b.classCode)),
    findPoints,
    exportedAt,
  };
}

/** The trench's finds as positions by class, read as bare numbers (no find rows are kept). */
async function readFindPoints(db: Db, siteId: string, trenchId: string): Promise<TrenchRecord["findPoints"]> {
  const classes = await listClassLooks(db, siteId);
  const rows = await db
    .select({ classId: finds.classId, x: finds.x, y: finds.y })
    .from(finds)
    .where(eq(finds.trenchId, trenchId));
  const byClass = new Map<string, { x: number[]; y: number[] }>();
  for (const r of rows) {
    let pts = byClass.get(r.classId);
    if (!pts) byClass.set(r.classId, (pts = { x: [], y: [] }));
    pts.x.push(r.x);
    pts.y.push(r.y);
  }
  return classes
    .filter((c) => byClass.has(c.id))
    .sort((a, b) => a.code.localeCompare(b.code))
    .map((c) => {
      const pts = byClass.get(c.id)!;
      return {
        classCode: c.code,
        classLabel: c.label,
        colour: c.colour,
        symbol: c.symbol,
        x: Float64Array.from(pts.x),
        y: Float64Array.from(pts.y),
      };
    });
}
