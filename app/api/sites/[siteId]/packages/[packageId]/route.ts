import { api } from "@/lib/server/api-catalog";
import { readPackage } from "@/lib/server/export/package-jobs";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.packageRead, (ctx) => readPackage(ctx.db, siteActor(ctx), ctx.params.packageId));
