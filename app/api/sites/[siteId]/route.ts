import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { siteOverview, updateSite } from "@/lib/server/sites";

export const GET = guardedRoute(api.siteRead, (ctx) => siteOverview(ctx.db, siteActor(ctx)));
export const PATCH = guardedRoute(api.siteUpdate, (ctx) => updateSite(ctx.db, siteActor(ctx), ctx.input));
