import { api } from "@/lib/server/api-catalog";
import { exportTrenches } from "@/lib/server/export/files";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.exportTrenches, (ctx) => exportTrenches(ctx.db, siteActor(ctx).site, ctx.input));
