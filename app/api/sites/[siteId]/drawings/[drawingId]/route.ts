import { api } from "@/lib/server/api-catalog";
import { deleteDrawing, updateDrawing } from "@/lib/server/drawings";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const PATCH = guardedRoute(api.drawingUpdate, (ctx) =>
  updateDrawing(ctx.db, siteActor(ctx), ctx.params.drawingId, ctx.input),
);
export const DELETE = guardedRoute(api.drawingDelete, (ctx) =>
  deleteDrawing(ctx.db, siteActor(ctx), ctx.params.drawingId, ctx.input.reason),
);
