import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { accountNumbers } from "@/lib/server/number-accounting";

export const GET = guardedRoute(api.numberAccounting, (ctx) =>
  accountNumbers(ctx.db, siteActor(ctx).site.id, ctx.input.kind),
);
