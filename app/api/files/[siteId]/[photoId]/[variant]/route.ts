import { api } from "@/lib/server/api-catalog";
import { badInput } from "@/lib/server/errors";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { readPhotoFile } from "@/lib/server/photos";

/**
 * Photo files (the derivatives and the uploaded original) are streamed only to members of the photo's site; strangers
 * get 404 like any other record.
 */
export const GET = guardedRoute(api.photoFile, (ctx) => {
  const variant = ctx.params.variant;
  if (variant !== "display" && variant !== "thumb" && variant !== "warp" && variant !== "original")
    throw badInput("Ask for display, thumb, warp or original.");
  return readPhotoFile(ctx.db, siteActor(ctx).site.id, ctx.params.photoId, variant);
});
