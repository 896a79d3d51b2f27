import { api } from "@/lib/server/api-catalog";
import { createRun, listRuns } from "@/lib/server/analysis/runs";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.runsList, (ctx) => listRuns(ctx.db, siteActor(ctx).site.id, ctx.input.trenchId));
export const POST = guardedRoute(api.runsCreate, (ctx) => createRun(ctx.db, siteActor(ctx), ctx.input));
