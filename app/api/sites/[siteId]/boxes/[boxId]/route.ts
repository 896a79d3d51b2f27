import { api } from "@/lib/server/api-catalog";
import { deleteBox, readBox, updateBox } from "@/lib/server/boxes";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.boxRead, (ctx) => readBox(ctx.db, siteActor(ctx).site.id, ctx.params.boxId));
export const PATCH = guardedRoute(api.boxUpdate, (ctx) =>
  updateBox(ctx.db, siteActor(ctx), ctx.params.boxId, ctx.input),
);
export const DELETE = guardedRoute(api.boxDelete, (ctx) => deleteBox(ctx.db, siteActor(ctx), ctx.params.boxId));
