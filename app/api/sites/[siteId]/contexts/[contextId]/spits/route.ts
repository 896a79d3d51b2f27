import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { createSpit, listSpits } from "@/lib/server/spits";

export const GET = guardedRoute(api.spitsList, (ctx) =>
  listSpits(ctx.db, siteActor(ctx).site.id, ctx.params.contextId!),
);
export const POST = guardedRoute(api.spitsCreate, (ctx) =>
  createSpit(ctx.db, siteActor(ctx), ctx.params.contextId!, ctx.input),
);
