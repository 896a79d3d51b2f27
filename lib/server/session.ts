import "server-only";
import { auth } from "@/auth";

/** The signed-in user's id from the session, or null. Roles are never read from the session. */
export async function currentUserId(): Promise<string | null> {
  const session = await auth();
  const id = session?.user?.id;
  return typeof id === "string" && id.length > 0 ? id : null;
}
