import { api } from "@/lib/server/api-catalog";
import { readRun } from "@/lib/server/analysis/runs";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.runRead, (ctx) => readRun(ctx.db, siteActor(ctx).site.id, ctx.params.runId));
