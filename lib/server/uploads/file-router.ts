import "server-only";
import { createUploadthing, type FileRouter } from "uploadthing/next";
import { UploadThingError } from "uploadthing/server";
import { z } from "zod";
import { getDb } from "@/db/client";
import { recorders } from "@/lib/api/operation";
import { PublicError, isPublicError } from "../errors";
import { runGuarded, siteActor, type GuardOutcome } from "../guard";
import { storeUploadedPhoto } from "../photos";
import { assertRecordPhotoAllowed, storeRecordPhoto } from "../record-photos";
import { recordPhotoUploadSchema } from "@/lib/schemas/record-photo";
import { getTrench } from "../trenches";
import { PHOTO_MAX_BYTES, PHOTO_TYPES } from "./photo-limits";
import { fetchUpload, forgetUpload } from "./remote";

export { PHOTO_MAX_BYTES, PHOTO_TYPES };

/**
 * The client reads a refusal's message, and for record photos sent from the device's outbox also the
 * status and reason code the JSON API would have given (a lock is 409 `locked`), so the outbox treats it alike.
 */
const f = createUploadthing({
  errorFormatter: (err) => {
    const cause = isPublicError(err.cause) ? err.cause : null;
    return {
      message: err.message,
      status: cause?.status ?? null,
      reason: cause?.code ?? null,
      fieldErrors: cause?.fieldErrors ?? null,
    };
  },
});

/** Turns Loamwork's refusals into upload refusals the client shows as they are. */
function refuse(err: unknown): never {
  if (isPublicError(err))
    throw new UploadThingError({
      cause: err,
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

/** The guard's refusal (signed in, member of the site, role, input), as an upload refusal. */
function refuseOutcome(outcome: Extract<GuardOutcome<unknown>, { ok: false }>): never {
  if (outcome.status >= 500) throw new UploadThingError({ code: "INTERNAL_SERVER_ERROR", message: outcome.error });
  const status = outcome.status as PublicError["status"];
  refuse(new PublicError(status, outcome.error, outcome.fieldErrors, outcome.details, outcome.code));
}

const trenchPhotoInput = z.object({ siteId: z.string().uuid(), trenchId: z.string().uuid() });

/** The type and size of each file, refused before anything is sent, naming the file. */
function checkFiles(files: readonly { name: string; type: string; size: number }[], what: string) {
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
        message: `“${file.name}” is ${(file.size / 1048576).toFixed(1)} MB; the limit for ${what} is 16 MB.`,
      });
    }
  }
}

/** Reads the upload's original from the service; on any refusal nothing stays behind there. */
async function processed<T>(fileKey: string, store: (bytes: Buffer) => Promise<T>, what: string) {
  try {
    return await store(await fetchUpload(fileKey, PHOTO_MAX_BYTES));
  } catch (err) {
    // Nothing was recorded, so nothing may stay behind at the upload service either.
    await forgetUpload(fileKey);
    // The refusal travels back to the uploader as server data: onUploadComplete must not throw.
    if (isPublicError(err)) return { error: err.message, status: err.status, reason: err.code ?? null };
    console.error(`[loamwork] ${what} upload processing failed`, err);
    return {
      error: "The photo arrived but could not be processed; nothing was recorded.",
      status: 500,
      reason: null as string | null,
    };
  }
}

/** The upload's JSON as sent; the record photo's own schema reads it in the middleware, naming each field. */
const jsonFields = z.record(z.string(), z.union([z.string(), z.number(), z.null()]));

export const uploadRouter = {
  trenchPhoto: f({ image: { maxFileSize: "16MB", maxFileCount: 1 } })
    .input(trenchPhotoInput)
    .middleware(async ({ input, files }) => {
      // Through the one guarded entry, as every write: signed in, a member of this site, a recorder.
      const outcome = await runGuarded(
        { roles: recorders, doing: "upload plan photos", input: trenchPhotoInput },
        input.siteId,
        () => input,
        async ({ db, userId, input: { siteId, trenchId } }) => {
          await getTrench(db, siteId, trenchId);
          return { siteId, trenchId, userId };
        },
      );
      if (!outcome.ok) refuseOutcome(outcome);
      checkFiles(files, "a plan photo");
      return outcome.data;
    })
    .onUploadComplete(async ({ metadata, file }) => {
      const out = await processed(
        file.key,
        async (bytes) => {
          const photo = await storeUploadedPhoto(await getDb(), {
            ...metadata,
            fileKey: file.key,
            fileName: file.name,
            mimeType: file.type,
            bytes,
          });
          return { photoId: photo.id as string | null, error: null as string | null };
        },
        "photo",
      );
      return "photoId" in out ? out : { photoId: null, error: out.error };
    }),

  /**
   * A record photo of the photo register: the file with what it is of and its sheet. The device's
   * idempotency key travels as the `idempotency-key` header, so an upload replayed from the outbox
   * records one photo.
   */
  recordPhoto: f({ image: { maxFileSize: "16MB", maxFileCount: 1 } })
    .input(jsonFields)
    .middleware(async ({ req, input: raw, files }) => {
      // The site is named inside the sheet (no site for a malformed id: not found); the rest is read after the role.
      const siteId = z.string().uuid().safeParse(raw.siteId).data;
      const outcome = await runGuarded(
        { roles: recorders, doing: "add record photos", input: recordPhotoUploadSchema },
        siteId,
        () => raw,
        async (ctx) => {
          await assertRecordPhotoAllowed(ctx.db, siteActor(ctx), ctx.input);
          return { userId: ctx.userId, input: ctx.input };
        },
      );
      if (!outcome.ok) refuseOutcome(outcome);
      checkFiles(files, "a photo");
      const key = req.headers.get("idempotency-key");
      return { ...outcome.data, clientKey: key && key.length <= 100 ? key : null };
    })
    .onUploadComplete(async ({ metadata, file }) => {
      const out = await processed(
        file.key,
        async (bytes) => {
          const photo = await storeRecordPhoto(await getDb(), {
            ...metadata,
            fileKey: file.key,
            fileName: file.name,
            mimeType: file.type,
            bytes,
          });
          return { photoId: photo.id as string | null, number: photo.number, error: null as string | null };
        },
        "record photo",
      );
      return "photoId" in out
        ? { ...out, status: 201, reason: null as string | null }
        : { photoId: null, number: null, error: out.error, status: out.status, reason: out.reason };
    }),
} satisfies FileRouter;

export type UploadRouter = typeof uploadRouter;
