import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { createSection, listSections } from "@/lib/server/sections";
import { getTrench } from "@/lib/server/trenches";

export const GET = guardedRoute(api.sectionsList, async (ctx) => {
  const site = siteActor(ctx).site;
  const trench = await getTrench(ctx.db, site.id, ctx.params.trenchId);
  return listSections(ctx.db, site.id, trench.id);
});
export const POST = guardedRoute(api.sectionsCreate, (ctx) =>
  createSection(ctx.db, siteActor(ctx), ctx.params.trenchId, ctx.input),
);
