import { acceptInvitation, invitationAcceptSchema } from "@/lib/server/invitations";
import { publicRoute } from "../../public-route";

export const POST = publicRoute(invitationAcceptSchema, (db, input) => acceptInvitation(db, input));
