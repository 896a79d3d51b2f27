import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { listPhotos } from "@/lib/server/photos";

export const GET = guardedRoute(api.photosList, (ctx) =>
  listPhotos(ctx.db, siteActor(ctx).site.id, ctx.input.trenchId),
);
