import { api } from "@/lib/server/api-catalog";
import { findIdsMatching } from "@/lib/server/finds";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { MAX_BULK_FINDS } from "@/lib/schemas/finds-bulk";

export const GET = guardedRoute(api.findIds, (ctx) =>
  findIdsMatching(ctx.db, siteActor(ctx).site.id, ctx.input, MAX_BULK_FINDS),
);
