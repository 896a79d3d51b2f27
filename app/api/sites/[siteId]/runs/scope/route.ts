import { api } from "@/lib/server/api-catalog";
import { scopeSummary } from "@/lib/server/analysis/scope-summary";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.runScope, (ctx) => {
  const { site } = siteActor(ctx);
  return scopeSummary(ctx.db, site.id, ctx.input, site.levelSpreadCaution);
});
