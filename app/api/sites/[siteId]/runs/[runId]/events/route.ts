import { api } from "@/lib/server/api-catalog";
import { runEventStream } from "@/lib/server/analysis/run-watch";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.runEvents, (ctx) =>
  runEventStream(ctx.db, siteActor(ctx).site.id, ctx.params.runId, ctx.req.signal),
);
