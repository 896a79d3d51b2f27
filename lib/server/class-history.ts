import "server-only";
import { and, asc, eq, gt, inArray } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { artefactClasses, auditEntries, finds, users, type ArtefactClass, type Context } from "@/db/schema";
import { formatStamp } from "./locks";

/**
 * Classes after sign-off. A class is the site's shared word for a kind of find, so a specialist may
 * still rename it or flag it as human remains after finds of it were signed off. A signed-off record
 * must go on saying what was signed off: it reads its classes as they stood at its sign-off, from the
 * class's audit trail (every class update keeps its before and after), and says what changed since.
 * Only what a record says of a find counts here: the class's code, label and human-remains flag.
 */
export type ClassFace = { code: string; label: string; humanRemains: boolean };
export type ClassChange = { classId: string; at: Date; byName: string | null; from: ClassFace; to: ClassFace };
/** A class as a signed-off record reads it, with every change to it since that sign-off. */
export type ClassAsSignedOff = { classId: string; face: ClassFace; changes: ClassChange[] };

const faceOf = (c: Partial<ArtefactClass> | null | undefined): ClassFace => ({
  code: String(c?.code ?? ""),
  label: String(c?.label ?? ""),
  humanRemains: Boolean(c?.humanRemains),
});
const sameFace = (a: ClassFace, b: ClassFace) =>
  a.code === b.code && a.label === b.label && a.humanRemains === b.humanRemains;

/** Every change to the code, label or flag of these classes after `since`, oldest first. */
export async function classChangesSince(
  db: Db | Tx,
  siteId: string,
  classIds: string[],
  since: Date,
): Promise<ClassChange[]> {
  if (classIds.length === 0) return [];
  const rows = await db
    .select({
      classId: auditEntries.recordId,
      at: auditEntries.at,
      before: auditEntries.before,
      after: auditEntries.after,
      byName: users.name,
    })
    .from(auditEntries)
    .leftJoin(users, eq(users.id, auditEntries.actorId))
    .where(
      and(
        eq(auditEntries.siteId, siteId),
        eq(auditEntries.recordType, "class"),
        eq(auditEntries.action, "update"),
        inArray(auditEntries.recordId, classIds),
        gt(auditEntries.at, since),
      ),
    )
    .orderBy(asc(auditEntries.id));
  return rows
    .map((r) => ({
      classId: r.classId,
      at: r.at,
      byName: r.byName,
      from: faceOf(r.before as ArtefactClass),
      to: faceOf(r.after as ArtefactClass),
    }))
    .filter((c) => !sameFace(c.from, c.to));
}

/**
 * How a record signed off at `signedOffAt` reads each of `classes`: the face before the first change after
 * sign-off (or the current one when nothing changed), and the changes since. `changes` may hold changes
 * from an earlier date (one read serving several sign-offs); those before `signedOffAt` are ignored.
 */
export function classesAsSignedOff(
  classes: ArtefactClass[],
  changes: ClassChange[],
  signedOffAt: Date,
): Map<string, ClassAsSignedOff> {
  const out = new Map<string, ClassAsSignedOff>();
  for (const c of classes) {
    const since = changes.filter((x) => x.classId === c.id && x.at > signedOffAt);
    out.set(c.id, { classId: c.id, face: since[0]?.from ?? faceOf(c), changes: since });
  }
  return out;
}

const named = (f: ClassFace) => `${f.code} “${f.label}”`;

/** One change in words, e.g. "Class FL “Flint flake” renamed to BF “Burnt flint” after sign-off, on … by …". */
export function describeClassChange(c: ClassChange): string {
  const what: string[] = [];
  if (c.from.code !== c.to.code || c.from.label !== c.to.label) what.push(`renamed to ${named(c.to)}`);
  if (c.from.humanRemains !== c.to.humanRemains)
    what.push(c.to.humanRemains ? "flagged as human remains" : "no longer flagged as human remains");
  return `Class ${named(c.from)} ${what.join(" and ")} after sign-off, on ${formatStamp(c.at)} by ${c.byName ?? "someone no longer on record"}.`;
}

/** For one signed-off context and the classes of its finds: how they read at sign-off, and the sentences to show. */
export async function signedOffClassNotes(db: Db | Tx, siteId: string, signedOffAt: Date, classes: ArtefactClass[]) {
  const changes = await classChangesSince(
    db,
    siteId,
    classes.map((c) => c.id),
    signedOffAt,
  );
  const faces = classesAsSignedOff(classes, changes, signedOffAt);
  return { faces, notes: changes.map(describeClassChange) };
}

/**
 * What a signed-off context sheet says of the classes of its finds changed since its sign-off (none if not signed off).
 */
export async function contextClassNotes(db: Db | Tx, context: Context): Promise<string[]> {
  if (context.state !== "signed_off" || !context.signedOffAt) return [];
  const used = await db
    .selectDistinct({ cls: artefactClasses })
    .from(finds)
    .innerJoin(artefactClasses, eq(artefactClasses.id, finds.classId))
    .where(and(eq(finds.siteId, context.siteId), eq(finds.contextId, context.id)));
  return (
    await signedOffClassNotes(
      db,
      context.siteId,
      context.signedOffAt,
      used.map((r) => r.cls),
    )
  ).notes;
}
