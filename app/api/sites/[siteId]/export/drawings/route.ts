import { api } from "@/lib/server/api-catalog";
import { exportDrawings } from "@/lib/server/export/files";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.exportDrawings, (ctx) => exportDrawings(ctx.db, siteActor(ctx).site, ctx.input));
