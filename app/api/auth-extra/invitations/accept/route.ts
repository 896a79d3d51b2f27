import { api } from "@/lib/server/api-catalog";
import { publicRoute } from "@/lib/server/http";
import { acceptInvitation } from "@/lib/server/invitations";

export const POST = publicRoute(api.invitationAccept, (ctx) => acceptInvitation(ctx.db, ctx.input));
