import { api } from "@/lib/server/api-catalog";
import { scopeSummary } from "@/lib/server/analysis/scope-summary";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.runScope, (ctx) => scopeSummary(ctx.db, siteActor(ctx).site.id, ctx.input));
