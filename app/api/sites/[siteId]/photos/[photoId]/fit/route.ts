import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { fitSitePhoto } from "@/lib/server/photos";

export const POST = guardedRoute(api.photoFit, (ctx) =>
  fitSitePhoto(ctx.db, siteActor(ctx), ctx.params.photoId, ctx.input),
);
