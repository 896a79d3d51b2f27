import "server-only";
import { getDb } from "@/db/client";
import { readInvitation } from "../invitations";

/** What the invitation page shows for a mailed link: the invitation's site, role and standing (no sign-in needed). */
export async function invitationByToken(token: string) {
  return readInvitation(await getDb(), token);
}
