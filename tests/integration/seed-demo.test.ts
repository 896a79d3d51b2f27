import { describe, expect, it } from "vitest";
import { count, eq, max } from "drizzle-orm";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { DEMO_USERS, seedDemo } from "@/scripts/seed/seed-demo";
import { checkOutline } from "@/lib/geometry/outline";

describe("demo site seed", () => {
  it("creates the site once and changes nothing when run again", async () => {
    const db = await getDb();
    const first = await seedDemo(db);
    expect(first.created).toBe(true);
    const tables = [
      s.users,
      s.sites,
      s.memberships,
      s.trenches,
      s.contexts,
      s.contextRelations,
      s.artefactClasses,
      s.finds,
    ];
    const counts = async () => Promise.all(tables.map(async (t) => (await db.select({ n: count() }).from(t))[0].n));
    const before = await counts();
    const second = await seedDemo(db);
    expect(second).toEqual({ created: false, siteId: first.siteId });
    expect(await counts()).toEqual(before);
  });

  it("has one user per role, several hundred finds, each inside its trench, and a gapless number sequence", async () => {
    const db = await getDb();
    const { siteId } = await seedDemo(db);
    const members = await db.select().from(s.memberships).where(eq(s.memberships.siteId, siteId));
    expect(members.map((m) => m.role).sort()).toEqual(DEMO_USERS.map((u) => u.role).sort());
    const trenches = await db.select().from(s.trenches).where(eq(s.trenches.siteId, siteId));
    expect(trenches.some((t) => t.outline.coordinates.length > 1)).toBe(true);
    const found = await db.select().from(s.finds).where(eq(s.finds.siteId, siteId));
    expect(found.length).toBeGreaterThanOrEqual(300);
    for (const t of trenches) {
      const check = checkOutline(t.outline);
      expect(check.ok).toBe(true);
      if (!check.ok) continue;
      for (const f of found.filter((f) => f.trenchId === t.id)) expect(check.window.contains(f.x, f.y)).toBe(true);
    }
    const [{ top }] = await db
      .select({ top: max(s.finds.number) })
      .from(s.finds)
      .where(eq(s.finds.siteId, siteId));
    expect(top).toBe(found.length);
    const [site] = await db.select().from(s.sites).where(eq(s.sites.id, siteId));
    expect(site.nextFindNumber).toBe(found.length + 1);
  });
});

describe("demo trench photo", () => {
  it("is added once, fitted to the grid through its four pegs with sub-centimetre residuals", async () => {
    const { seedDemoPhoto } = await import("@/scripts/seed/seed-demo-photo");
    const { loadFile } = await import("@/lib/server/uploads/file-store");
    const db = await getDb();
    await seedDemo(db);
    expect(await seedDemoPhoto(db)).toBe(true);
    expect(await seedDemoPhoto(db)).toBe(false);
    const rows = await db.select().from(s.photos);
    expect(rows).toHaveLength(1);
    const fit = rows[0].fit as { model: string; points: unknown[]; residuals: number[]; rms: number };
    expect(fit.model).toBe("similarity");
    expect(fit.points).toHaveLength(4);
    // The pegs' pixels are whole pixels at 95 px/m: rounding moves each by at most √2/2 px ≈ 7.4 mm.
    for (const r of fit.residuals) expect(r).toBeLessThan(0.0075);
    const display = await loadFile(rows[0].displayPath!);
    expect(display?.subarray(0, 2)).toEqual(Buffer.from([0xff, 0xd8]));
  });
});
