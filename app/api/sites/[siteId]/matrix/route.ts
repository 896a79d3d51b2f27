import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { siteMatrix } from "@/lib/server/relations";

export const GET = guardedRoute(api.matrixRead, (ctx) =>
  siteMatrix(ctx.db, siteActor(ctx).site.id, ctx.input.trenchId),
);
