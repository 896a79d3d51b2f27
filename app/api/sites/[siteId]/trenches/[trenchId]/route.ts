import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { expectedVersionOf } from "@/lib/server/versions";
import { deleteTrench, getTrench, updateTrench } from "@/lib/server/trenches";

export const GET = guardedRoute(api.trenchRead, (ctx) =>
  getTrench(ctx.db, siteActor(ctx).site.id, ctx.params.trenchId),
);
export const PATCH = guardedRoute(api.trenchUpdate, (ctx) =>
  updateTrench(ctx.db, siteActor(ctx), ctx.params.trenchId, ctx.input, expectedVersionOf(ctx.req)),
);
export const DELETE = guardedRoute(api.trenchDelete, (ctx) =>
  deleteTrench(ctx.db, siteActor(ctx), ctx.params.trenchId, expectedVersionOf(ctx.req)),
);
