import "server-only";
import { notFound, redirect } from "next/navigation";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import type { UrlSearch } from "@/lib/schemas/url-query";
import { isPublicError } from "./errors";
import { loadSiteActor, type SiteActor } from "./membership";
import { siteReads, userReads, type SiteReads } from "./reads/site-reads";
import { currentUserId } from "./session";

async function signedInUser() {
  const id = await currentUserId();
  if (!id) redirect("/sign-in");
  const db = await getDb();
  const [user] = await db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(eq(users.id, id));
  if (!user) redirect("/sign-in");
  return { db, user };
}

/** For server components: the signed-in user and the reads of their own pages, or a redirect to sign-in. */
export async function pageUser() {
  const { db, user } = await signedInUser();
  return { user, read: userReads(db, user.id) };
}

/** What a site's page with filters in its URL is given: the site from the path, the filters from the query. */
export type SiteSearchPageProps = { params: Promise<{ siteId: string }>; searchParams: Promise<UrlSearch> };

/** For server components of a site: the caller's role there and the site's reads, or 404 for non-members. */
export async function pageSiteActor(siteId: string): Promise<{ actor: SiteActor; userName: string; read: SiteReads }> {
  const { db, user } = await signedInUser();
  try {
    const actor = await loadSiteActor(db, user.id, siteId);
    return { actor, userName: user.name, read: siteReads(db, actor) };
  } catch (err) {
    if (isPublicError(err) && err.status === 404) notFound();
    throw err;
  }
}
