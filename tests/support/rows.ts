/**
 * Rows written straight into the test database, for tests that need a record to act on (no route, no audit):
 * a member, a trench, a context and a find on the fixture's site.
 */
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { makeUser, type SiteFixture } from "./fixtures";

/** A new user who is a digger on the fixture's site. */
export async function insertMember(fx: SiteFixture, name: string) {
  const u = await makeUser(name);
  const db = await getDb();
  await db.insert(schema.memberships).values({ siteId: fx.site.id, userId: u.id, role: "digger" });
  return u;
}

/** A trench on the fixture's site whose outline is the one closed ring given. */
export async function insertTrench(fx: SiteFixture, code: string, ring: [number, number][]) {
  const db = await getDb();
  const [t] = await db
    .insert(schema.trenches)
    .values({ siteId: fx.site.id, code, outline: { type: "Polygon", coordinates: [ring] } })
    .returning();
  return t!;
}

/** A context in the fixture's trench. */
export async function insertContext(
  fx: SiteFixture,
  number: number,
  type: (typeof schema.contexts.$inferInsert)["type"],
) {
  const db = await getDb();
  const [c] = await db
    .insert(schema.contexts)
    .values({ siteId: fx.site.id, trenchId: fx.trench.id, number, type })
    .returning();
  return c!;
}

/** A find typed in at (1, 1) in the fixture's context and class. */
export async function insertFindRow(fx: SiteFixture, number: number) {
  const db = await getDb();
  const [f] = await db
    .insert(schema.finds)
    .values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId: fx.context.id,
      classId: fx.cls.id,
      number,
      x: 1,
      y: 1,
      method: "typed",
    })
    .returning();
  return f!;
}
