import { api } from "@/lib/server/api-catalog";
import { exportSamples } from "@/lib/server/export/files";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.exportSamples, (ctx) => exportSamples(ctx.db, siteActor(ctx).site, ctx.input));
