import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { deleteSection } from "@/lib/server/sections";

export const DELETE = guardedRoute(api.sectionDelete, (ctx) =>
  deleteSection(ctx.db, siteActor(ctx), ctx.params.trenchId, ctx.params.sectionId),
);
