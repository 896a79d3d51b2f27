import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { listRecordPhotos } from "@/lib/server/record-photos";

export const GET = guardedRoute(api.recordPhotosList, (ctx) =>
  listRecordPhotos(ctx.db, siteActor(ctx).site.id, ctx.input),
);
