import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { signOffContext } from "@/lib/server/sign-off";

export const POST = guardedRoute(api.contextSignOff, (ctx) =>
  signOffContext(ctx.db, siteActor(ctx), ctx.params.contextId),
);
