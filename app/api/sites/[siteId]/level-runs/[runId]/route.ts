import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { getLevelRun } from "@/lib/server/level-runs";

export const GET = guardedRoute(api.levelRunRead, (ctx) =>
  getLevelRun(ctx.db, siteActor(ctx).site.id, ctx.params.runId!),
);
