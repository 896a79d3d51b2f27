import "server-only";
import { and, desc, eq, inArray } from "drizzle-orm";
import type { Db } from "@/db/client";
import { analysisRuns, artefactClasses, auditEntries, contexts, users, type Trench } from "@/db/schema";
import { readingFrom, readingLabels } from "@/lib/schemas/relation";
import { drawMatrix } from "@/lib/server/export/matrix-svg";
import { classChangesSince, classesAsSignedOff, describeClassChange, type ClassFace } from "@/lib/server/class-history";
import { buildMatrix } from "@/lib/server/matrix";
import { readRunResult } from "@/lib/server/analysis/stored-result";
import { trenchFingerprint, trenchRecordSet } from "@/lib/server/sign-off";

/**
 * Everything the printable trench record shows, read in one place so the fingerprint printed on it is
 * computed from exactly the records printed (trenchRecordSet), not from a second query that could differ.
 */
export async function loadTrenchReport(db: Db, trench: Trench) {
  const set = await trenchRecordSet(db, trench);
  const fingerprint = await trenchFingerprint(db, trench);
  const people = new Map((await db.select({ id: users.id, name: users.name }).from(users)).map((u) => [u.id, u.name]));
  const nameOf = (id: string | null) => (id ? (people.get(id) ?? "unknown") : null);
  const classes = await db.select().from(artefactClasses).where(eq(artefactClasses.siteId, trench.siteId));
  const classById = new Map(classes.map((c) => [c.id, c]));
  const numberOf = new Map(set.contexts.map((c) => [c.id, c.number]));
  // Relations may reach contexts of other trenches; their numbers are looked up for the sheets.
  const otherIds = set.relations.flatMap((r) => [r.fromId, r.toId]).filter((id) => !numberOf.has(id));
  if (otherIds.length) {
    for (const c of await db
      .select({ id: contexts.id, number: contexts.number })
      .from(contexts)
      .where(inArray(contexts.id, otherIds)))
      numberOf.set(c.id, c.number);
  }
  // Signed-off sheets read their finds' classes as they stood at sign-off, and say what changed since.
  const signedAts = set.contexts.flatMap((c) => (c.signedOffAt ? [c.signedOffAt] : []));
  const earliest = signedAts.length ? new Date(Math.min(...signedAts.map((d) => d.getTime()))) : null;
  const classChanges = earliest
    ? await classChangesSince(
        db,
        trench.siteId,
        classes.map((c) => c.id),
        earliest,
      )
    : [];
  const asSignedOff = new Map(
    set.contexts.map((c) => [c.id, c.signedOffAt ? classesAsSignedOff(classes, classChanges, c.signedOffAt) : null]),
  );
  const classNotesOf = (c: (typeof set.contexts)[number]) => {
    const used = new Set(set.finds.filter((f) => f.contextId === c.id).map((f) => f.classId));
    const faces = asSignedOff.get(c.id);
    return faces
      ? [...faces.values()].filter((x) => used.has(x.classId)).flatMap((x) => x.changes.map(describeClassChange))
      : [];
  };
  const sheets = set.contexts.map((c) => ({
    ...c,
    recordedByName: nameOf(c.recordedBy),
    submittedByName: nameOf(c.submittedBy),
    signedOffByName: nameOf(c.signedOffBy),
    finds: set.finds.filter((f) => f.contextId === c.id).length,
    classNotes: classNotesOf(c),
    relations: set.relations
      .filter((r) => r.fromId === c.id || r.toId === c.id)
      .map((r) => {
        const seen = readingFrom(r, c.id);
        return `${readingLabels[seen.reading]} ${numberOf.get(seen.otherId) ?? "?"}`;
      }),
  }));
  const here = new Set(set.contexts.map((c) => c.id));
  const inTrench = set.relations.filter((r) => here.has(r.fromId) && here.has(r.toId));
  const matrix = buildMatrix(
    set.contexts.map((c) => ({ id: c.id, number: c.number })),
    inTrench,
  );
  const matrixSvg = set.contexts.length
    ? drawMatrix(matrix, new Map(set.contexts.map((c) => [c.id, { type: c.type, state: c.state }]))).svg
    : null;
  const faceOf = (contextId: string, classId: string): ClassFace | null => {
    const cls = classById.get(classId);
    return (
      asSignedOff.get(contextId)?.get(classId)?.face ??
      (cls ? { code: cls.code, label: cls.label, humanRemains: cls.humanRemains } : null)
    );
  };
  const finds = set.finds.map((f) => ({
    ...f,
    contextNumber: numberOf.get(f.contextId) ?? null,
    cls: classById.get(f.classId) ?? null,
    classFace: faceOf(f.contextId, f.classId),
    recordedByName: nameOf(f.recordedBy),
  }));
  const runs = await db
    .select()
    .from(analysisRuns)
    .where(and(eq(analysisRuns.trenchId, trench.id), eq(analysisRuns.status, "done")))
    .orderBy(desc(analysisRuns.finishedAt))
    .limit(20);
  // The fingerprint stamped when the trench was last signed off, to show whether the records still match it.
  const [stamp] = await db
    .select({ after: auditEntries.after, at: auditEntries.at })
    .from(auditEntries)
    .where(
      and(
        eq(auditEntries.recordType, "trench"),
        eq(auditEntries.recordId, trench.id),
        eq(auditEntries.action, "sign-off"),
      ),
    )
    .orderBy(desc(auditEntries.id))
    .limit(1);
  const stampedFingerprint = (stamp?.after as { fingerprint?: string } | null)?.fingerprint ?? null;
  const usedClasses = classes.filter((c) => set.finds.some((f) => f.classId === c.id));
  return {
    trench,
    signedOffByName: nameOf(trench.signedOffBy),
    sheets,
    matrixSvg,
    finds,
    classes: usedClasses,
    runs: runs.map((run) => ({ ...run, result: readRunResult(run) })),
    fingerprint,
    stampedFingerprint,
  };
}

export type TrenchReport = Awaited<ReturnType<typeof loadTrenchReport>>;
