import { api } from "@/lib/server/api-catalog";
import { updateDatum } from "@/lib/server/benchmarks";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const PATCH = guardedRoute(api.datumUpdate, (ctx) => updateDatum(ctx.db, siteActor(ctx), ctx.input));
