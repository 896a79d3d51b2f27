import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { changeMemberRole, removeMember } from "@/lib/server/sites";

export const PATCH = guardedRoute(api.memberUpdate, (ctx) =>
  changeMemberRole(ctx.db, siteActor(ctx), ctx.params.userId, ctx.input.role),
);
export const DELETE = guardedRoute(api.memberRemove, (ctx) => removeMember(ctx.db, siteActor(ctx), ctx.params.userId));
