import { api } from "@/lib/server/api-catalog";
import { deleteContext, getContext, updateContext } from "@/lib/server/contexts";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { expectedVersionOf } from "@/lib/server/versions";

export const GET = guardedRoute(api.contextRead, (ctx) =>
  getContext(ctx.db, siteActor(ctx).site.id, ctx.params.contextId),
);
export const PATCH = guardedRoute(api.contextUpdate, (ctx) =>
  updateContext(ctx.db, siteActor(ctx), ctx.params.contextId, ctx.input, expectedVersionOf(ctx.req)),
);
export const DELETE = guardedRoute(api.contextDelete, (ctx) =>
  deleteContext(ctx.db, siteActor(ctx), ctx.params.contextId, expectedVersionOf(ctx.req)),
);
