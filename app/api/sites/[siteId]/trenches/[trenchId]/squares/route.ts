import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { listTrenchSquares, recordSquareSample } from "@/lib/server/squares";

export const GET = guardedRoute(api.trenchSquares, (ctx) =>
  listTrenchSquares(ctx.db, siteActor(ctx).site.id, ctx.params.trenchId!),
);
export const POST = guardedRoute(api.squareRecord, (ctx) =>
  recordSquareSample(ctx.db, siteActor(ctx), ctx.params.trenchId!, ctx.input),
);
