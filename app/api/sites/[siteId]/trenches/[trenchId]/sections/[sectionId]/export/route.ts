import { api } from "@/lib/server/api-catalog";
import { exportSection } from "@/lib/server/export/section-export";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const GET = guardedRoute(api.sectionExport, (ctx) =>
  exportSection(ctx.db, siteActor(ctx).site, ctx.params.trenchId, ctx.params.sectionId, ctx.input),
);
