import "server-only";
import { and, eq } from "drizzle-orm";
import type { Db, Tx } from "@/db/client";
import { memberships, sites, type Role, type Site } from "@/db/schema";
import { badInput, forbidden, notFound } from "./errors";

export type SiteActor = { userId: string; site: Site; role: Role };

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The caller's role on a site, looked up on the server every time. Strangers get 404, not 403. */
export async function loadSiteActor(db: Db | Tx, userId: string, siteId: string): Promise<SiteActor> {
  if (!uuidPattern.test(siteId)) throw notFound("That site");
  const rows = await db
    .select({ site: sites, role: memberships.role })
    .from(memberships)
    .innerJoin(sites, eq(sites.id, memberships.siteId))
    .where(and(eq(memberships.siteId, siteId), eq(memberships.userId, userId)))
    .limit(1);
  const row = rows[0];
  if (!row) throw notFound("That site");
  return { userId, site: row.site, role: row.role };
}

export function isRole(actor: SiteActor, roles: readonly Role[]): boolean {
  return roles.includes(actor.role);
}

export function assertRole(actor: SiteActor, roles: readonly Role[], doing = "do that"): void {
  if (!isRole(actor, roles)) {
    throw forbidden(`A ${actor.role} cannot ${doing} on this site; it needs the role ${roles.join(" or ")}.`);
  }
}

/**
 * A person named on a record (who drew it, who took the sample) is a member of the site; nobody named is
 * fine. Refused on the field that named them, with `who` saying what they did ("who drew it").
 */
export async function assertNamedMember(
  tx: Db | Tx,
  siteId: string,
  userId: string | null | undefined,
  field: string,
  who: string,
): Promise<void> {
  if (!userId) return;
  const [row] = await tx
    .select({ userId: memberships.userId })
    .from(memberships)
    .where(and(eq(memberships.siteId, siteId), eq(memberships.userId, userId)));
  if (!row)
    throw badInput(`The person ${who} is not a member of this site.`, { [field]: ["Pick a member of this site."] });
}
