import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { createTrench, listTrenches } from "@/lib/server/trenches";

export const GET = guardedRoute(api.trenchesList, (ctx) => listTrenches(ctx.db, siteActor(ctx).site.id));
export const POST = guardedRoute(api.trenchesCreate, (ctx) => createTrench(ctx.db, siteActor(ctx), ctx.input));
