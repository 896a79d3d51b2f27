import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { getImportMapping } from "@/lib/server/import/mapping-store";

export const GET = guardedRoute(api.importMappingRead, async (ctx) => ({
  mapping: await getImportMapping(ctx.db, siteActor(ctx).site.id),
}));
