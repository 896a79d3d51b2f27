import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { deleteSample, readSample, updateSample } from "@/lib/server/samples";

export const GET = guardedRoute(api.sampleRead, (ctx) =>
  readSample(ctx.db, siteActor(ctx).site.id, ctx.params.sampleId),
);
export const PATCH = guardedRoute(api.sampleUpdate, (ctx) =>
  updateSample(ctx.db, siteActor(ctx), ctx.params.sampleId, ctx.input),
);
export const DELETE = guardedRoute(api.sampleDelete, (ctx) =>
  deleteSample(ctx.db, siteActor(ctx), ctx.params.sampleId, ctx.input.reason),
);
