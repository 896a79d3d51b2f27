import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { createSample, listSamples } from "@/lib/server/samples";

export const GET = guardedRoute(api.samplesList, (ctx) => listSamples(ctx.db, siteActor(ctx).site.id, ctx.input));
export const POST = guardedRoute(api.samplesCreate, (ctx) => createSample(ctx.db, siteActor(ctx), ctx.input));
