import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { deleteSquareSample } from "@/lib/server/squares";

export const DELETE = guardedRoute(api.squareDelete, (ctx) =>
  deleteSquareSample(ctx.db, siteActor(ctx), ctx.params.sampleId!),
);
