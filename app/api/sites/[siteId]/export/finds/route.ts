import { api } from "@/lib/server/api-catalog";
import { exportFinds } from "@/lib/server/export/files";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.exportFinds, (ctx) => exportFinds(ctx.db, siteActor(ctx).site, ctx.input));
