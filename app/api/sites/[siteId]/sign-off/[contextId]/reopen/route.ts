import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { reopenContext } from "@/lib/server/sign-off";

export const POST = guardedRoute(api.contextReopen, (ctx) =>
  reopenContext(ctx.db, siteActor(ctx), ctx.params.contextId, ctx.input.reason),
);
