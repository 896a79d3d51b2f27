import "server-only";
import { createUploadthing, type FileRouter } from "uploadthing/next";
import { UploadThingError } from "uploadthing/server";
import { z } from "zod";
import { getDb } from "@/db/client";
import { recorders } from "@/lib/api/operation";
import { isPublicError } from "../errors";
import { assertRole, loadSiteActor } from "../membership";
import { storeUploadedPhoto } from "../photos";
import { currentUserId } from "../session";
import { getTrench } from "../trenches";
import { PHOTO_MAX_BYTES, PHOTO_TYPES } from "./photo-limits";
import { fetchUpload, forgetUpload } from "./remote";

export { PHOTO_MAX_BYTES, PHOTO_TYPES };

const f = createUploadthing({ errorFormatter: (err) => ({ message: err.message }) });

/** Turns Loamwork's refusals into upload refusals the client shows as they are. */
function refuse(err: unknown): never {
  if (isPublicError(err))
    throw new UploadThingError({
      code:
        err.status === 401
          ? "FORBIDDEN"
          : err.status === 404
            ? "NOT_FOUND"
            : err.status === 403
              ? "FORBIDDEN"
              : "BAD_REQUEST",
      message: err.message,
    });
  throw err;
}

export const uploadRouter = {
  trenchPhoto: f({ image: { maxFileSize: "16MB", maxFileCount: 1 } })
    .input(z.object({ siteId: z.string().uuid(), trenchId: z.string().uuid() }))
    .middleware(async ({ input, files }) => {
      const userId = await currentUserId();
      if (!userId) throw new UploadThingError({ code: "FORBIDDEN", message: "Sign in to upload photos." });
      const db = await getDb();
      try {
        const actor = await loadSiteActor(db, userId, input.siteId);
        assertRole(actor, recorders, "upload plan photos");
        await getTrench(db, input.siteId, input.trenchId);
      } catch (err) {
        refuse(err);
      }
      for (const file of files) {
        if (!PHOTO_TYPES.includes(file.type)) {
          throw new UploadThingError({
            code: "BAD_REQUEST",
            message: `“${file.name}” is ${file.type || "of no known type"}, not a photo: upload a JPEG, PNG, WebP, TIFF, HEIF or AVIF image.`,
          });
        }
        if (file.size > PHOTO_MAX_BYTES) {
          throw new UploadThingError({
            code: "TOO_LARGE",
            message: `“${file.name}” is ${(file.size / 1048576).toFixed(1)} MB; the limit for a plan photo is 16 MB.`,
          });
        }
      }
      return { siteId: input.siteId, trenchId: input.trenchId, userId };
    })
    .onUploadComplete(async ({ metadata, file }) => {
      try {
        const bytes = await fetchUpload(file.key, PHOTO_MAX_BYTES);
        const photo = await storeUploadedPhoto(await getDb(), {
          ...metadata,
          fileKey: file.key,
          fileName: file.name,
          mimeType: file.type,
          bytes,
        });
        return { photoId: photo.id, error: null as string | null };
      } catch (err) {
        // Nothing was recorded, so nothing may stay behind at the upload service either.
        await forgetUpload(file.key);
        // The refusal travels back to the uploader as server data: onUploadComplete must not throw.
        if (isPublicError(err)) return { photoId: null, error: err.message };
        console.error("[loamwork] photo upload processing failed", err);
        return { photoId: null, error: "The photo arrived but could not be processed; nothing was recorded." };
      }
    }),
} satisfies FileRouter;

export type UploadRouter = typeof uploadRouter;
