import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { removeRelation } from "@/lib/server/relations";

export const DELETE = guardedRoute(api.relationDelete, (ctx) =>
  removeRelation(ctx.db, siteActor(ctx), ctx.params.relationId),
);
