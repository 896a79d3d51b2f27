import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { submitContext } from "@/lib/server/sign-off";

export const POST = guardedRoute(api.contextSubmit, (ctx) =>
  submitContext(ctx.db, siteActor(ctx), ctx.params.contextId),
);
