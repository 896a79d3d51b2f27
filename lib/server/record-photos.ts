import "server-only";
import { and, asc, count, eq, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { Db, Tx } from "@/db/client";
import { contexts, finds, photos, trenches, users, type Photo } from "@/db/schema";
import { recorders } from "@/lib/api/operation";
import type {
  PhotoSubject,
  RecordPhotoListQuery,
  RecordPhotoUpdate,
  RecordPhotoUpload,
} from "@/lib/schemas/record-photo";
import { recordAudit } from "./audit";
import { notFound } from "./errors";
import { assertFieldRights } from "./field-rights";
import { getContext } from "./contexts";
import { getFind } from "./finds";
import { assertContextWritable, assertTrenchWritable } from "./locks";
import { assertNamedMember, assertRole, type SiteActor } from "./membership";
import { auditedPhoto, getPhoto, savePhotoFiles } from "./photos";
import { allocateRegisterNumber } from "./register-numbers";
import { getTrench } from "./trenches";
import { photoFolder, removeFolder } from "./uploads/file-store";
import { photoTakenAt } from "./uploads/photo-date";
import { forgetUpload } from "./uploads/remote";
import { written } from "./written";

/**
 * The photo register (issue 15 item 2): record photos of a context, a find or a trench, numbered per site
 * without gaps, with facing, scale, caption, who took it and when. They share the photos table, its files
 * and its member-only file route with the plan underlays. A photo is locked with what it is of: a context's
 * (or a find's context's) sign-off state, or the trench's sign-off.
 */

type Subject = { contextId: string | null; findId: string | null; trenchId: string | null };

/** What the photo is of, checked to be of this site, and refused while it is locked. */
async function writableSubject(
  tx: Db | Tx,
  siteId: string,
  subject: PhotoSubject,
  subjectId: string,
  doing: string,
): Promise<Subject> {
  if (subject === "context") {
    await assertContextWritable(tx, await getContext(tx, siteId, subjectId), doing);
    return { contextId: subjectId, findId: null, trenchId: null };
  }
  if (subject === "find") {
    const find = await getFind(tx, siteId, subjectId);
    await assertContextWritable(tx, await getContext(tx, siteId, find.contextId), doing);
    return { contextId: null, findId: subjectId, trenchId: null };
  }
  await assertTrenchWritable(tx, await getTrench(tx, siteId, subjectId), doing);
  return { contextId: null, findId: null, trenchId: subjectId };
}

const subjectOf = (p: Photo): [PhotoSubject, string] =>
  p.contextId ? ["context", p.contextId] : p.findId ? ["find", p.findId] : ["trench", p.trenchId ?? ""];

/** Who may upload this record photo: the upload route's middleware asks before any byte is sent. */
export async function assertRecordPhotoAllowed(db: Db, actor: SiteActor, input: RecordPhotoUpload): Promise<void> {
  assertRole(actor, recorders, "add record photos");
  await writableSubject(db, actor.site.id, input.subject, input.subjectId, "given new photos");
  await assertNamedMember(db, actor.site.id, input.takenBy, "takenBy", "who took it");
}

export type UploadedRecordPhoto = {
  userId: string;
  input: RecordPhotoUpload;
  /** The device's idempotency key, when it sent one. */
  clientKey: string | null;
  fileKey: string;
  fileName: string;
  mimeType: string;
  bytes: Buffer;
};

async function byClientKey(db: Db | Tx, siteId: string, key: string | null) {
  if (!key) return undefined;
  const [row] = await db
    .select()
    .from(photos)
    .where(and(eq(photos.siteId, siteId), eq(photos.clientKey, key)));
  return row;
}

/**
 * Runs in onUploadComplete: derivatives and the camera's date first (refusing non-images), then the number
 * and the record in one transaction, audited. A replay of an upload already recorded (same idempotency key)
 * records nothing and answers the first photo; the second copy at the upload service goes.
 */
export async function storeRecordPhoto(db: Db, up: UploadedRecordPhoto): Promise<{ id: string; number: number }> {
  const siteId = up.input.siteId;
  const seen = await byClientKey(db, siteId, up.clientKey);
  if (seen) {
    if (seen.fileKey !== up.fileKey) await forgetUpload(up.fileKey);
    return { id: seen.id, number: seen.number ?? 0 };
  }
  const { id, folder, files } = await savePhotoFiles(siteId, up);
  const taken = await photoTakenAt(up.bytes);
  try {
    return await db.transaction(async (tx) => {
      const subject = await writableSubject(tx, siteId, up.input.subject, up.input.subjectId, "given new photos");
      await assertNamedMember(tx, siteId, up.input.takenBy, "takenBy", "who took it");
      const number = await allocateRegisterNumber(tx, siteId, "photo");
      const row = written(
        await tx
          .insert(photos)
          .values({
            id,
            siteId,
            kind: "record",
            ...subject,
            number,
            facing: up.input.facing ?? null,
            scale: up.input.scale,
            caption: up.input.caption,
            takenBy: up.input.takenBy ?? up.userId,
            takenAt: taken.at,
            takenAtSource: taken.source,
            clientKey: up.clientKey,
            ...files,
          })
          .returning(),
        "The new photo",
      );
      await recordAudit(tx, {
        siteId,
        actorId: up.userId,
        action: "create",
        recordType: "photo",
        recordId: id,
        after: auditedPhoto(row, up.bytes.length),
      });
      return { id, number };
    });
  } catch (err) {
    await removeFolder(folder);
    throw err;
  }
}

async function getRecordPhoto(tx: Db | Tx, siteId: string, photoId: string): Promise<Photo> {
  return getPhoto(tx, siteId, photoId, "record");
}

/** Caption, facing, scale or who took it; refused while what the photo is of is locked. */
export async function updateRecordPhoto(db: Db, actor: SiteActor, photoId: string, input: RecordPhotoUpdate) {
  assertFieldRights("photo", actor.role, input);
  return db.transaction(async (tx) => {
    const before = await getRecordPhoto(tx, actor.site.id, photoId);
    const [subject, subjectId] = subjectOf(before);
    await writableSubject(tx, actor.site.id, subject, subjectId, "changed (nor its photos)");
    await assertNamedMember(tx, actor.site.id, input.takenBy, "takenBy", "who took it");
    if (!Object.keys(input).length) return registerRow(tx, actor.site.id, photoId);
    const after = written(
      await tx
        .update(photos)
        .set({ ...input, updatedAt: new Date() })
        .where(eq(photos.id, photoId))
        .returning(),
      "The photo",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "update",
      recordType: "photo",
      recordId: photoId,
      before: auditedPhoto(before),
      after: auditedPhoto(after),
    });
    return registerRow(tx, actor.site.id, photoId);
  });
}

/** Deleted with a stated reason (kept in the audit trail); the number is never handed out again. */
export async function deleteRecordPhoto(db: Db, actor: SiteActor, photoId: string, reason: string) {
  const before = await db.transaction(async (tx) => {
    const row = await getRecordPhoto(tx, actor.site.id, photoId);
    const [subject, subjectId] = subjectOf(row);
    await writableSubject(tx, actor.site.id, subject, subjectId, "changed (nor its photos)");
    await tx.delete(photos).where(eq(photos.id, photoId));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "photo",
      recordId: photoId,
      before: auditedPhoto(row),
      reason,
    });
    return row;
  });
  await removeFolder(photoFolder(actor.site.id, photoId));
  await forgetUpload(before.fileKey);
  return { deleted: photoId, number: before.number ?? 0 };
}

// Reading the register -----------------------------------------------------------------------------

const ofContext = alias(contexts, "photo_context");
const ofFind = alias(finds, "photo_find");
const findContext = alias(contexts, "photo_find_context");
const takenByUser = alias(users, "photo_taken_by");
/** The trench a record photo belongs to: its own, its context's, or its find's. */
const trenchOf = sql<string>`coalesce(${photos.trenchId}, ${ofContext.trenchId}, ${ofFind.trenchId})`;

function registerFilter(siteId: string, q: Omit<RecordPhotoListQuery, "page" | "pageSize">): SQL | undefined {
  const where: SQL[] = [eq(photos.siteId, siteId), eq(photos.kind, "record")];
  if (q.trenchId) where.push(sql`${trenchOf} = ${q.trenchId}`);
  if (q.contextId) where.push(eq(photos.contextId, q.contextId));
  if (q.findId) where.push(eq(photos.findId, q.findId));
  return and(...where);
}

const fileUrl = (siteId: string, id: string, variant: string) => `/api/files/${siteId}/${id}/${variant}`;

function registerQuery(db: Db | Tx, where: SQL | undefined) {
  return db
    .select({
      id: photos.id,
      siteId: photos.siteId,
      number: photos.number,
      contextId: photos.contextId,
      contextNumber: ofContext.number,
      findId: photos.findId,
      findNumber: ofFind.number,
      ownTrenchId: photos.trenchId,
      trenchId: trenches.id,
      trenchCode: trenches.code,
      trenchSignedOffAt: trenches.signedOffAt,
      contextState: sql<string | null>`coalesce(${ofContext.state}, ${findContext.state})`,
      facing: photos.facing,
      scale: photos.scale,
      caption: photos.caption,
      takenById: photos.takenBy,
      takenBy: takenByUser.name,
      takenAt: photos.takenAt,
      takenAtSource: photos.takenAtSource,
      fileName: photos.fileName,
      width: photos.width,
      height: photos.height,
      createdAt: photos.createdAt,
      updatedAt: photos.updatedAt,
    })
    .from(photos)
    .leftJoin(ofContext, eq(ofContext.id, photos.contextId))
    .leftJoin(ofFind, eq(ofFind.id, photos.findId))
    .leftJoin(findContext, eq(findContext.id, ofFind.contextId))
    .leftJoin(trenches, sql`${trenches.id} = ${trenchOf}`)
    .leftJoin(takenByUser, eq(takenByUser.id, photos.takenBy))
    .where(where)
    .orderBy(asc(photos.number))
    .$dynamic();
}

type RawRow = Awaited<ReturnType<typeof registerQuery>>[number];

function toRow(r: RawRow) {
  const subject: PhotoSubject = r.contextId ? "context" : r.findId ? "find" : "trench";
  const state = (subject === "trench" ? (r.trenchSignedOffAt ? "signed_off" : "open") : (r.contextState ?? "open")) as
    "open" | "awaiting" | "signed_off";
  const { ownTrenchId: _own, trenchSignedOffAt: _signed, contextState: _state, siteId, ...rest } = r;
  return {
    ...rest,
    number: r.number ?? 0,
    trenchId: r.trenchId ?? "",
    trenchCode: r.trenchCode ?? "",
    subject,
    state,
    locked: state !== "open",
    takenAtSource: r.takenAtSource ?? "upload",
    thumbUrl: fileUrl(siteId, r.id, "thumb"),
    displayUrl: fileUrl(siteId, r.id, "display"),
    originalUrl: fileUrl(siteId, r.id, "original"),
  };
}

export type RecordPhotoRow = ReturnType<typeof toRow>;

async function registerRow(tx: Db | Tx, siteId: string, photoId: string): Promise<RecordPhotoRow> {
  const [row] = await registerQuery(tx, and(registerFilter(siteId, {}), eq(photos.id, photoId)));
  if (!row) throw notFound("That photo");
  return toRow(row);
}

/** One page of the photo register, in number order, with the register's filters. */
export async function listRecordPhotos(db: Db, siteId: string, q: RecordPhotoListQuery) {
  const where = registerFilter(siteId, q);
  const [rows, [total]] = await Promise.all([
    registerQuery(db, where)
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize),
    db
      .select({ n: count() })
      .from(photos)
      .leftJoin(ofContext, eq(ofContext.id, photos.contextId))
      .leftJoin(ofFind, eq(ofFind.id, photos.findId))
      .where(where),
  ]);
  return { page: q.page, pageSize: q.pageSize, total: total?.n ?? 0, rows: rows.map(toRow) };
}

/** Every record photo the filters select (the package, the printed register). */
export async function allRecordPhotos(db: Db, siteId: string, q: Omit<RecordPhotoListQuery, "page" | "pageSize"> = {}) {
  return (await registerQuery(db, registerFilter(siteId, q))).map(toRow);
}
