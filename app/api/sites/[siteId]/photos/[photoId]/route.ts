import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { deleteSitePhoto, getPhoto, toPhotoView } from "@/lib/server/photos";

export const GET = guardedRoute(api.photoRead, async (ctx) =>
  toPhotoView(await getPhoto(ctx.db, siteActor(ctx).site.id, ctx.params.photoId, "plan")),
);
export const DELETE = guardedRoute(api.photoDelete, (ctx) =>
  deleteSitePhoto(ctx.db, siteActor(ctx), ctx.params.photoId),
);
