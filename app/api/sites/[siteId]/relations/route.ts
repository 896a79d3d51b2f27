import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { addRelation, listRelations, relationsOfContext } from "@/lib/server/relations";

export const GET = guardedRoute(api.relationsList, async (ctx) => {
  const siteId = siteActor(ctx).site.id;
  return ctx.input.contextId ? relationsOfContext(ctx.db, siteId, ctx.input.contextId) : listRelations(ctx.db, siteId);
});
export const POST = guardedRoute(api.relationsCreate, (ctx) => addRelation(ctx.db, siteActor(ctx), ctx.input));
