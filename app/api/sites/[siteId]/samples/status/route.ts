import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { setSampleStatus } from "@/lib/server/samples";

export const POST = guardedRoute(api.samplesStatus, (ctx) =>
  setSampleStatus(ctx.db, siteActor(ctx), ctx.input.sampleIds, ctx.input.status),
);
