import { api } from "@/lib/server/api-catalog";
import { updateClass } from "@/lib/server/artefact-classes";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";

export const PATCH = guardedRoute(api.classUpdate, (ctx) =>
  updateClass(ctx.db, siteActor(ctx), ctx.params.classId, ctx.input),
);
