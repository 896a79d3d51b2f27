import { api } from "@/lib/server/api-catalog";
import { createContext, listContexts } from "@/lib/server/contexts";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.contextsList, (ctx) =>
  listContexts(ctx.db, siteActor(ctx).site.id, ctx.input.trenchId),
);
export const POST = guardedRoute(api.contextsCreate, (ctx) => createContext(ctx.db, siteActor(ctx), ctx.input));
