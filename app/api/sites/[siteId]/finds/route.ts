import { api } from "@/lib/server/api-catalog";
import { createFind, listFinds } from "@/lib/server/finds";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.findsList, (ctx) => listFinds(ctx.db, siteActor(ctx).site.id, ctx.input));
export const POST = guardedRoute(api.findsCreate, (ctx) => createFind(ctx.db, siteActor(ctx), ctx.input));
