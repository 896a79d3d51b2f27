import { api } from "@/lib/server/api-catalog";
import { cancelRun } from "@/lib/server/analysis/runs";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const POST = guardedRoute(api.runCancel, (ctx) => cancelRun(ctx.db, siteActor(ctx), ctx.params.runId));
