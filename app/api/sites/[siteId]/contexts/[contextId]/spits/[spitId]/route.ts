import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { deleteSpit, updateSpit } from "@/lib/server/spits";

export const PATCH = guardedRoute(api.spitUpdate, (ctx) =>
  updateSpit(ctx.db, siteActor(ctx), ctx.params.contextId!, ctx.params.spitId!, ctx.input),
);
export const DELETE = guardedRoute(api.spitDelete, (ctx) =>
  deleteSpit(ctx.db, siteActor(ctx), ctx.params.contextId!, ctx.params.spitId!),
);
