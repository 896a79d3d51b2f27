import { api } from "@/lib/server/api-catalog";
import { deleteFind, getFind, updateFind } from "@/lib/server/finds";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { expectedVersionOf } from "@/lib/server/versions";

export const GET = guardedRoute(api.findRead, (ctx) => getFind(ctx.db, siteActor(ctx).site.id, ctx.params.findId));
export const PATCH = guardedRoute(api.findUpdate, (ctx) =>
  updateFind(ctx.db, siteActor(ctx), ctx.params.findId, ctx.input, expectedVersionOf(ctx.req)),
);
export const DELETE = guardedRoute(api.findDelete, (ctx) =>
  deleteFind(ctx.db, siteActor(ctx), ctx.params.findId, expectedVersionOf(ctx.req)),
);
