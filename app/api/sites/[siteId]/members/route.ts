import { api } from "@/lib/server/api-catalog";
import { siteActor } from "@/lib/server/guard";
import { guardedRoute } from "@/lib/server/http";
import { listMembers } from "@/lib/server/sites";

// No POST: people join a site only by accepting an invitation mailed to them (POST …/invitations).

export const GET = guardedRoute(api.membersList, (ctx) => listMembers(ctx.db, siteActor(ctx).site.id));
