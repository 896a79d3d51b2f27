import { api } from "@/lib/server/api-catalog";
import { listPackages, startPackage } from "@/lib/server/export/package-jobs";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const POST = guardedRoute(api.packagesCreate, (ctx) => startPackage(ctx.db, siteActor(ctx), ctx.input));
export const GET = guardedRoute(api.packagesList, (ctx) => listPackages(ctx.db, siteActor(ctx)));
