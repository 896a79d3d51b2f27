/**
 * The demo site seeded into the test database, with the ids the Patterns tests need: trench A, its
 * contexts by number, the site's classes by code and the demo users by role.
 */
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { DEMO_USERS, seedDemo } from "@/scripts/seed/seed-demo";

export interface DemoSite {
  siteId: string;
  trenchId: string;
  ctx: Record<number, string>;
  cls: Record<string, string>;
  people: Record<string, string>;
}

export async function seedDemoSite(): Promise<DemoSite> {
  const db = await getDb();
  const { siteId } = await seedDemo(db);
  const [trench] = await db
    .select()
    .from(s.trenches)
    .where(and(eq(s.trenches.siteId, siteId), eq(s.trenches.code, "A")));
  const contexts = await db.select().from(s.contexts).where(eq(s.contexts.trenchId, trench.id));
  const classes = await db.select().from(s.artefactClasses).where(eq(s.artefactClasses.siteId, siteId));
  const people: Record<string, string> = {};
  for (const u of DEMO_USERS)
    people[u.role] = (await db.select().from(s.users).where(eq(s.users.email, u.email)))[0].id;
  return {
    siteId,
    trenchId: trench.id,
    people,
    ctx: Object.fromEntries(contexts.map((c) => [c.number, c.id])),
    cls: Object.fromEntries(classes.map((c) => [c.code, c.id])),
  };
}
