import { api } from "@/lib/server/api-catalog";
import { notFound } from "@/lib/server/errors";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { revokeInvitation } from "@/lib/server/invitations";

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const DELETE = guardedRoute(api.invitationRevoke, (ctx) => {
  if (!uuidPattern.test(ctx.params.invitationId)) throw notFound("That invitation");
  return revokeInvitation(ctx.db, siteActor(ctx), ctx.params.invitationId);
});
