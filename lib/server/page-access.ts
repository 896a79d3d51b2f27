import "server-only";
import { notFound, redirect } from "next/navigation";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import { isPublicError } from "./errors";
import { loadSiteActor, type SiteActor } from "./membership";
import { currentUserId } from "./session";

/** For server components: the signed-in user, or a redirect to sign-in. */
export async function pageUser() {
  const id = await currentUserId();
  if (!id) redirect("/sign-in");
  const db = await getDb();
  const [user] = await db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.id, id));
  if (!user) redirect("/sign-in");
  return { db, user };
}

/** For server components of a site: the caller's role there, or 404 for non-members. */
export async function pageSiteActor(siteId: string): Promise<{ db: Awaited<ReturnType<typeof pageUser>>["db"]; actor: SiteActor; userName: string }> {
  const { db, user } = await pageUser();
  try {
    return { db, actor: await loadSiteActor(db, user.id, siteId), userName: user.name };
  } catch (err) {
    if (isPublicError(err) && err.status === 404) notFound();
    throw err;
  }
}
