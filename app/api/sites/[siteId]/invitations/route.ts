import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { createInvitation, listInvitations } from "@/lib/server/invitations";

export const GET = guardedRoute(api.invitationsList, (ctx) => listInvitations(ctx.db, siteActor(ctx).site.id));
export const POST = guardedRoute(api.invitationsCreate, (ctx) => createInvitation(ctx.db, siteActor(ctx), ctx.input));
