import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { deleteRecordPhoto, updateRecordPhoto } from "@/lib/server/record-photos";

export const PATCH = guardedRoute(api.recordPhotoUpdate, (ctx) =>
  updateRecordPhoto(ctx.db, siteActor(ctx), ctx.params.photoId, ctx.input),
);
export const DELETE = guardedRoute(api.recordPhotoDelete, (ctx) =>
  deleteRecordPhoto(ctx.db, siteActor(ctx), ctx.params.photoId, ctx.input.reason),
);
