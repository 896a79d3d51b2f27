import { api } from "@/lib/server/api-catalog";
import { exportGeoPackage } from "@/lib/server/export/gis-export";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.exportGis, (ctx) => exportGeoPackage(ctx.db, siteActor(ctx).site, ctx.input));
