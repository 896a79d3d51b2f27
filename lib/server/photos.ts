import "server-only";
import { and, desc, eq } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { photos, type Photo } from "@/db/schema";
import { fitPhoto, PhotoFitError } from "@/lib/geometry/photo-fit";
import type { PhotoFitInput, PhotoView, StoredFit } from "@/lib/geometry/photo-fit-input";
import { recordAudit } from "./audit";
import { badInput, notFound } from "./errors";
import type { SiteActor } from "./membership";
import { getTrench } from "./trenches";
import { makeDerivatives } from "./uploads/derivatives";
import { loadFile, photoFolder, removeFolder, saveFile } from "./uploads/file-store";
import { PHOTO_MAX_BYTES } from "./uploads/photo-limits";
import { fetchUpload, forgetUpload } from "./uploads/remote";
import { warpProjective } from "./uploads/warp";
import { written } from "./written";

/**
 * Photos of the trench plan. `width`/`height` are those of the display derivative (EXIF orientation
 * applied); control points are pixels of that derivative.
 */
const fileUrl = (p: Photo, variant: string) => `/api/files/${p.siteId}/${p.id}/${variant}`;

export function toPhotoView(p: Photo): PhotoView {
  const fit = (p.fit as StoredFit | null) ?? null;
  return {
    id: p.id,
    trenchId: p.trenchId,
    fileName: p.fileName,
    width: p.width,
    height: p.height,
    displayUrl: fileUrl(p, "display"),
    thumbUrl: fileUrl(p, "thumb"),
    createdAt: p.createdAt.toISOString(),
    fit: fit && { ...fit, warp: fit.warp && { ...fit.warp, url: fileUrl(p, "warp") } },
  };
}

export async function listPhotos(db: Db, siteId: string, trenchId?: string): Promise<PhotoView[]> {
  const plan = and(eq(photos.siteId, siteId), eq(photos.kind, "plan"));
  const where = trenchId ? and(plan, eq(photos.trenchId, trenchId)) : plan;
  const rows = await db.select().from(photos).where(where).orderBy(desc(photos.createdAt));
  return rows.map(toPhotoView);
}

/**
 * One photo of the site: a plan underlay, a record photo of the register, or (no kind given, the file route) either.
 */
export async function getPhoto(db: Db | Tx, siteId: string, photoId: string, kind?: Photo["kind"]): Promise<Photo> {
  if (!/^[0-9a-f-]{36}$/i.test(photoId)) throw notFound("That photo");
  const [row] = await db
    .select()
    .from(photos)
    .where(and(eq(photos.siteId, siteId), eq(photos.id, photoId), kind ? eq(photos.kind, kind) : undefined));
  if (!row) throw notFound("That photo");
  return row;
}

export type UploadedPhoto = {
  siteId: string;
  trenchId: string;
  userId: string;
  fileKey: string;
  fileName: string;
  mimeType: string;
  bytes: Buffer;
};

/**
 * What the audit trail says of a photo: the file by name, size and type, and the photo's id — never the
 * upload service's key, which is a capability for the original, not a description of it.
 */
export function auditedPhoto(p: Photo, size?: number) {
  const { fileKey: _key, ...rest } = p;
  return size === undefined ? rest : { ...rest, size };
}

/**
 * An uploaded photo's derivatives (refusing what is not an image) saved under a new photo id, and the photo
 * row's file columns: what plan underlays and record photos store alike.
 */
export async function savePhotoFiles(
  siteId: string,
  up: { userId: string; fileKey: string; fileName: string; mimeType: string; bytes: Buffer },
) {
  const d = await makeDerivatives(up.bytes);
  const id = crypto.randomUUID();
  const folder = photoFolder(siteId, id);
  await saveFile(`${folder}/display.jpg`, d.display);
  await saveFile(`${folder}/thumb.jpg`, d.thumb);
  const files = {
    fileKey: up.fileKey,
    fileName: up.fileName,
    mimeType: up.mimeType,
    width: d.width,
    height: d.height,
    displayPath: `${folder}/display.jpg`,
    thumbPath: `${folder}/thumb.jpg`,
    uploadedBy: up.userId,
  };
  return { id, folder, files };
}

/** Runs in onUploadComplete: derivatives first (refusing non-images), then the record, audited. */
export async function storeUploadedPhoto(db: Db, up: UploadedPhoto): Promise<PhotoView> {
  await getTrench(db, up.siteId, up.trenchId);
  const { id, files } = await savePhotoFiles(up.siteId, up);
  const row = await db.transaction(async (tx) => {
    const row = written(
      await tx
        .insert(photos)
        .values({
          id,
          siteId: up.siteId,
          trenchId: up.trenchId,
          ...files,
        })
        .returning(),
      "The new photo",
    );
    await recordAudit(tx, {
      siteId: up.siteId,
      actorId: up.userId,
      action: "create",
      recordType: "photo",
      recordId: id,
      after: auditedPhoto(row, up.bytes.length),
    });
    return row;
  });
  return toPhotoView(row);
}

/** Fits a photo to the grid; a projective fit also gets a warped raster for the plan. */
export async function fitSitePhoto(
  db: Db,
  actor: SiteActor,
  photoId: string,
  input: PhotoFitInput,
): Promise<PhotoView> {
  const before = await getPhoto(db, actor.site.id, photoId, "plan");
  const { width, height } = before;
  if (width && height) {
    const off = input.points.findIndex((p) => p.px < 0 || p.py < 0 || p.px > width || p.py > height);
    if (off >= 0)
      throw badInput(
        `Point ${off + 1} is off the photo (${width} × ${height} px).`,
        { points: [`Point ${off + 1} is off the photo.`] },
        { points: [off] },
      );
  }
  let fit;
  try {
    fit = fitPhoto(input.points, { model: input.model });
  } catch (err) {
    if (err instanceof PhotoFitError)
      throw badInput(
        `The control points cannot fit this photo: ${err.message}`,
        { points: [err.message] },
        { points: err.points },
      );
    throw err;
  }
  const stored: StoredFit = {
    ...fit,
    points: input.points,
    fittedAt: new Date().toISOString(),
    fittedBy: actor.userId,
  };
  const folder = photoFolder(actor.site.id, photoId);
  if (fit.model === "projective") {
    const display = before.displayPath ? await loadFile(before.displayPath) : null;
    if (!display) throw badInput("This photo has no display image to warp; upload it again.");
    const warp = await warpProjective(display, fit.matrix);
    await saveFile(`${folder}/warp.png`, warp.png);
    stored.warp = {
      url: "",
      minX: warp.minX,
      minY: warp.minY,
      maxX: warp.maxX,
      maxY: warp.maxY,
      width: warp.width,
      height: warp.height,
    };
  }
  const after = await db.transaction(async (tx) => {
    const after = written(
      await tx.update(photos).set({ fit: stored }).where(eq(photos.id, photoId)).returning(),
      "The photo's fit",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "fit",
      recordType: "photo",
      recordId: photoId,
      before: before.fit,
      after: stored,
    });
    return after;
  });
  return toPhotoView(after);
}

export async function deleteSitePhoto(db: Db, actor: SiteActor, photoId: string) {
  const before = await getPhoto(db, actor.site.id, photoId, "plan");
  await db.transaction(async (tx) => {
    await tx.delete(photos).where(eq(photos.id, photoId));
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "delete",
      recordType: "photo",
      recordId: photoId,
      before: auditedPhoto(before),
    });
  });
  await removeFolder(photoFolder(actor.site.id, photoId));
  await forgetUpload(before.fileKey);
  return { deleted: photoId };
}

const variantTypes = { display: "image/jpeg", thumb: "image/jpeg", warp: "image/png" } as const;
export type PhotoVariant = keyof typeof variantTypes | "original";

/** The uploaded original, read from the upload service with the app's own credentials, as a download. */
async function readOriginal(p: Photo): Promise<Response> {
  let bytes: Buffer;
  try {
    bytes = await fetchUpload(p.fileKey, PHOTO_MAX_BYTES);
  } catch (err) {
    console.warn("[loamwork] original not available", p.id, err);
    throw notFound("That photo's original");
  }
  const name = p.fileName.replace(/[^\w.-]+/g, "_");
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": p.mimeType,
      "content-disposition": `attachment; filename="${name}"`,
      "cache-control": "private, no-store",
      "content-length": String(bytes.length),
      "x-content-type-options": "nosniff",
    },
  });
}

/** A derivative's or the original's bytes for a member of the photo's site (the caller has checked membership). */
export async function readPhotoFile(db: Db, siteId: string, photoId: string, variant: PhotoVariant) {
  const p = await getPhoto(db, siteId, photoId);
  if (variant === "original") return readOriginal(p);
  const rel =
    variant === "display"
      ? p.displayPath
      : variant === "thumb"
        ? p.thumbPath
        : p.fit && (p.fit as StoredFit).warp
          ? `${photoFolder(siteId, photoId)}/warp.png`
          : null;
  const bytes = rel ? await loadFile(rel) : null;
  if (!bytes) throw notFound("That photo file");
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": variantTypes[variant],
      "cache-control": "private, max-age=300",
      "content-length": String(bytes.length),
      "x-content-type-options": "nosniff",
    },
  });
}
