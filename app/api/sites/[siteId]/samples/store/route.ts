import { api } from "@/lib/server/api-catalog";
import { storeSamples } from "@/lib/server/boxes";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const POST = guardedRoute(api.samplesStore, (ctx) => storeSamples(ctx.db, siteActor(ctx), ctx.input));
