import { describe, expect, it } from "vitest";
import { session, call } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as siteRoute from "@/app/api/sites/[siteId]/route";
import * as sitesRoute from "@/app/api/sites/route";

describe("site overview and the sites list", () => {
  it("counts contexts and finds per trench, and lists the caller's role", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const [other] = await db
      .insert(schema.trenches)
      .values({
        siteId: fx.site.id,
        code: "Z",
        outline: {
          type: "Polygon",
          coordinates: [
            [
              [20, 0],
              [24, 0],
              [24, 3],
              [20, 0],
            ],
          ],
        },
      })
      .returning();
    await db.insert(schema.finds).values(
      [1, 2, 3].map((n) => ({
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        contextId: fx.context.id,
        classId: fx.cls.id,
        number: n,
        x: n,
        y: 1,
        method: "typed" as const,
      })),
    );
    session.userId = fx.people.specialist.id;
    const res = await call(siteRoute, "GET", { siteId: fx.site.id });
    expect(res.status).toBe(200);
    const byCode = Object.fromEntries(res.json.trenches.map((t: { code: string }) => [t.code, t]));
    expect(byCode.A).toMatchObject({ contexts: 1, finds: 3 });
    expect(byCode.Z).toMatchObject({ id: other.id, contexts: 0, finds: 0 });
    expect(res.json.role).toBe("specialist");
    const list = await call(sitesRoute, "GET", {});
    expect(list.json).toEqual([expect.objectContaining({ id: fx.site.id, role: "specialist", trenches: 2, finds: 3 })]);
  });

  it("hides a site from a stranger behind 404, not 403", async () => {
    const fx = await makeSite();
    session.userId = fx.people.stranger.id;
    const res = await call(siteRoute, "GET", { siteId: fx.site.id });
    expect(res.status).toBe(404);
    expect(res.json.error).toMatch(/not found/);
  });
});
