import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { listLevelRuns, recordLevelRun } from "@/lib/server/level-runs";

export const GET = guardedRoute(api.levelRunsList, (ctx) => listLevelRuns(ctx.db, siteActor(ctx).site.id));
export const POST = guardedRoute(api.levelRunsCreate, (ctx) => recordLevelRun(ctx.db, siteActor(ctx), ctx.input));
