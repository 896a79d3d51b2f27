import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { addMember, listMembers } from "@/lib/server/sites";

export const GET = guardedRoute(api.membersList, (ctx) => listMembers(ctx.db, siteActor(ctx).site.id));
export const POST = guardedRoute(api.membersAdd, (ctx) => addMember(ctx.db, siteActor(ctx), ctx.input));
