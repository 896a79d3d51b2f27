import { api } from "@/lib/server/api-catalog";
import { exportContexts } from "@/lib/server/export/files";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.exportContexts, (ctx) => exportContexts(ctx.db, siteActor(ctx).site, ctx.input));
