import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { call, session } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as trenchesRoute from "@/app/api/sites/[siteId]/trenches/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";

/** A closed wavy ring of n distinct vertices around (cx, cy), radius about r: simple. */
function wavy(n: number, cx: number, cy: number, r: number): [number, number][] {
  const ring = Array.from({ length: n }, (_, k) => {
    const t = (2 * Math.PI * k) / n;
    const rr = r * (1 + 0.05 * Math.sin(9 * t));
    return [cx + rr * Math.cos(t), cy + rr * Math.sin(t)] as [number, number];
  });
  return [...ring, ring[0]];
}

describe("outline and extent size limits", () => {
  it("refuses a trench outline of 2,001 vertices with the limit in the message, and opens no trench", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const res = await call(
      trenchesRoute,
      "POST",
      { siteId: fx.site.id },
      { code: "BIG", outline: { type: "Polygon", coordinates: [wavy(2001, 50, 50, 20)] } },
    );
    expect(res.status).toBe(400);
    expect(res.json.error).toMatch(/outline\.coordinates\.0: A ring may have at most 2,000 vertices/);
    const db = await getDb();
    expect(await db.select().from(schema.trenches).where(eq(schema.trenches.code, "BIG"))).toHaveLength(0);
  });

  it("opens a trench with a 2,000-vertex outline", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const res = await call(
      trenchesRoute,
      "POST",
      { siteId: fx.site.id },
      { code: "WIDE", outline: { type: "Polygon", coordinates: [wavy(2000, 50, 50, 20)] } },
    );
    expect(res.status).toBe(201);
    expect(res.json.outline.coordinates[0]).toHaveLength(2001);
  });

  it("refuses a context extent with more than 20 holes, naming the extent, and leaves the context as it was", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    // Trench A is 10 × 6 m from (0, 0) with a baulk at x 4–6, y 2–3; 21 small holes along y = 1.
    const outer: [number, number][] = [
      [0.5, 0.5],
      [9.5, 0.5],
      [9.5, 1.8],
      [0.5, 1.8],
      [0.5, 0.5],
    ];
    const holes = Array.from({ length: 21 }, (_, k) => {
      const x = 0.6 + 0.4 * k;
      return [
        [x, 1],
        [x + 0.2, 1],
        [x + 0.2, 1.2],
        [x, 1],
        [x, 1],
      ]
        .slice(0, 4)
        .concat([[x, 1]]) as [number, number][];
    });
    const res = await call(
      contextRoute,
      "PATCH",
      { siteId: fx.site.id, contextId: fx.context.id },
      { extent: { type: "Polygon", coordinates: [outer, ...holes] } },
    );
    expect(res.status).toBe(400);
    expect(res.json.error).toMatch(/extent\.coordinates: An outline may have at most 20 holes/);
    const db = await getDb();
    const [row] = await db.select().from(schema.contexts).where(eq(schema.contexts.id, fx.context.id));
    expect(row.extent).toBeNull();
  });

  it("still refuses a 2,000-vertex outline that crosses itself once", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const ring = wavy(2000, 50, 50, 20);
    [ring[700], ring[701]] = [ring[701], ring[700]];
    const res = await call(
      trenchesRoute,
      "POST",
      { siteId: fx.site.id },
      { code: "KNOT", outline: { type: "Polygon", coordinates: [ring] } },
    );
    expect(res.status).toBe(400);
    expect(res.json.fieldErrors.outline[0]).toMatch(/crosses or touches itself \(edges 700 and 702\)/);
  });
});
