import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { importSquareCounts } from "@/lib/server/import/square-import";

export const POST = guardedRoute(api.squareImport, (ctx) => importSquareCounts(ctx.db, siteActor(ctx), ctx.input));
