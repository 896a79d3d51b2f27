import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { buildMatrix, loopIfAdded, type MatrixRelation } from "@/lib/server/matrix";
import * as relationsRoute from "@/app/api/sites/[siteId]/relations/route";
import * as relationRoute from "@/app/api/sites/[siteId]/relations/[relationId]/route";
import * as matrixRoute from "@/app/api/sites/[siteId]/matrix/route";

const ctx = (n: number) => ({ id: `c${n}`, number: n });
const rel = (from: number, kind: MatrixRelation["kind"], to: number, id = `${from}-${to}`): MatrixRelation => ({
  id,
  fromId: `c${from}`,
  toId: `c${to}`,
  kind,
});

describe("the matrix graph", () => {
  it("names the loop a new relation would close, in stratigraphic words", () => {
    // The loop of the example, built here by hand: 1004 above 1007 above 1011, then 1011 above 1004.
    const cs = [1004, 1007, 1011].map(ctx);
    const rs = [rel(1004, "above", 1007), rel(1007, "above", 1011)];
    expect(loopIfAdded(cs, rs, rel(1011, "above", 1004))).toBe("1011 above 1004 above 1007 above 1011");
    expect(loopIfAdded(cs, rs, rel(1004, "above", 1011))).toBeNull();
  });

  it("treats a same-as group as one node, for loops and for drawing", () => {
    const cs = [1004, 1008, 1009, 1010].map(ctx);
    const rs = [rel(1008, "same_as", 1009), rel(1004, "cuts", 1008), rel(1009, "above", 1010)];
    const m = buildMatrix(cs, rs);
    expect(m.nodes.map((n) => n.label)).toEqual(["1004", "1008 = 1009", "1010"]);
    expect(
      m.edges.map((e) => [m.nodes.find((n) => n.key === e.from)!.label, m.nodes.find((n) => n.key === e.to)!.label]),
    ).toEqual([
      ["1004", "1008 = 1009"],
      ["1008 = 1009", "1010"],
    ]);
    // 1010 above 1004 closes a loop that passes through the group: the name says where it crosses.
    expect(loopIfAdded(cs, rs, rel(1010, "above", 1004))).toBe("1010 above 1004 cuts 1008 same as 1009 above 1010");
    // Joining two contexts one of which lies above the other is a loop too.
    expect(loopIfAdded(cs, rs, rel(1004, "same_as", 1010))).toBe("1004 cuts 1008 same as 1009 above 1010 same as 1004");
    // A relation inside one group is a loop of its own.
    expect(loopIfAdded(cs, rs, rel(1008, "above", 1009))).toBe("1008 above 1009 same as 1008");
  });

  it("marks relations implied by a longer path as redundant", () => {
    // 1001 above 1002 above 1003 implies 1001 above 1003 (transitive reduction, Aho, Garey & Ullman 1972).
    const cs = [1001, 1002, 1003, 1004].map(ctx);
    const m = buildMatrix(cs, [
      rel(1001, "above", 1002),
      rel(1002, "above", 1003),
      rel(1001, "above", 1003),
      rel(1003, "fills", 1004),
    ]);
    expect(m.edges.filter((e) => e.redundant).map((e) => e.relation.id)).toEqual(["1001-1003"]);
    expect(m.loop).toBeNull();
  });

  it("agrees with a brute-force transitive reduction on random loop-free matrices", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 9 }),
        fc.array(fc.tuple(fc.nat(8), fc.nat(8)), { maxLength: 30 }),
        (n, pairs) => {
          // Edges only from lower to higher index: loop-free by construction.
          const uniq = [...new Set(pairs.map(([a, b]) => [a % n, b % n].sort((p, q) => p - q).join(",")))]
            .map((s) => s.split(",").map(Number))
            .filter(([a, b]) => a !== b);
          const cs = Array.from({ length: n }, (_, i) => ctx(i));
          const m = buildMatrix(
            cs,
            uniq.map(([a, b]) => rel(a, "above", b)),
          );
          // Floyd–Warshall reachability, then: a→b is redundant iff some c≠b with a→c and c reaches b.
          const R = Array.from({ length: n }, () => new Array(n).fill(false));
          for (const [a, b] of uniq) R[a][b] = true;
          for (let k = 0; k < n; k++)
            for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (R[i][k] && R[k][j]) R[i][j] = true;
          for (const e of m.edges) {
            const a = Number(e.from.slice(1));
            const b = Number(e.to.slice(1));
            const expected = uniq.some(([p, c]) => p === a && c !== b && R[c][b]);
            expect(e.redundant).toBe(expected);
          }
        },
      ),
    );
  });
});

async function addContexts(fx: SiteFixture, numbers: number[]) {
  const db = await getDb();
  const rows = await db
    .insert(schema.contexts)
    .values(numbers.map((number) => ({ siteId: fx.site.id, trenchId: fx.trench.id, number, type: "layer" as const })))
    .returning();
  return Object.fromEntries(rows.map((r) => [r.number, r]));
}

describe("relations through the API", () => {
  it("stores each relation once, reads it from both sides, and refuses a loop naming it", async () => {
    const fx = await makeSite();
    const c = await addContexts(fx, [1004, 1007, 1011]);
    session.userId = fx.people.digger.id;
    const params = { siteId: fx.site.id };
    // Typed on 1007's sheet as "1007 below 1004": stored as 1004 above 1007.
    const a = await call(relationsRoute, "POST", params, {
      contextId: c[1007].id,
      reading: "below",
      otherId: c[1004].id,
    });
    expect(a.status).toBe(201);
    expect([a.json.fromId, a.json.kind, a.json.toId]).toEqual([c[1004].id, "above", c[1007].id]);
    expect(
      (await call(relationsRoute, "POST", params, { contextId: c[1007].id, reading: "above", otherId: c[1011].id }))
        .status,
    ).toBe(201);

    const from1004 = await call(relationsRoute, "GET", params, undefined, { contextId: c[1004].id });
    const from1007 = await call(relationsRoute, "GET", params, undefined, { contextId: c[1007].id });
    expect(from1004.json.map((r: any) => `${r.label} ${r.otherNumber}`)).toEqual(["above 1007"]);
    expect(from1007.json.map((r: any) => `${r.label} ${r.otherNumber}`)).toEqual(["above 1011", "below 1004"]);

    const loop = await call(relationsRoute, "POST", params, {
      contextId: c[1011].id,
      reading: "above",
      otherId: c[1004].id,
    });
    expect(loop.status).toBe(400);
    expect(loop.json.error).toContain("1011 above 1004 above 1007 above 1011");
    const again = await call(relationsRoute, "POST", params, {
      contextId: c[1011].id,
      reading: "below",
      otherId: c[1007].id,
    });
    expect(again.status).toBe(409);
    expect(again.json.error).toContain("already related: 1011 below 1007");

    const db = await getDb();
    const stored = await db
      .select()
      .from(schema.contextRelations)
      .where(eq(schema.contextRelations.siteId, fx.site.id));
    expect(stored).toHaveLength(2);
    const audits = await db.select().from(schema.auditEntries).where(eq(schema.auditEntries.recordType, "relation"));
    expect(audits.filter((x) => x.siteId === fx.site.id)).toHaveLength(2);

    // "Same as" joins the fixture's context and 1011 into one node of the matrix.
    expect(
      (
        await call(relationsRoute, "POST", params, {
          contextId: fx.context.id,
          reading: "same_as",
          otherId: c[1011].id,
        })
      ).status,
    ).toBe(201);
    const m = await call(matrixRoute, "GET", params, undefined, {});
    expect(m.status).toBe(200);
    expect(m.json.loop).toBeNull();
    const joined = [fx.context.number, 1011].sort((p, q) => p - q).join(" = ");
    expect(m.json.nodes.map((n: any) => n.label).sort()).toEqual(["1004", "1007", joined].sort());
  });

  it("refuses to add or remove a relation of a signed-off context", async () => {
    const fx = await makeSite();
    const c = await addContexts(fx, [2001, 2002, 2003]);
    const db = await getDb();
    const [r] = await db
      .insert(schema.contextRelations)
      .values({ siteId: fx.site.id, fromId: c[2001].id, toId: c[2002].id, kind: "above" })
      .returning();
    await db
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffAt: new Date("2026-11-30T10:00:00Z"), signedOffBy: fx.people.director.id })
      .where(eq(schema.contexts.id, c[2002].id));
    session.userId = fx.people.digger.id;
    const add = await call(
      relationsRoute,
      "POST",
      { siteId: fx.site.id },
      { contextId: c[2003].id, reading: "above", otherId: c[2002].id },
    );
    expect(add.status).toBe(409);
    expect(add.json.error).toContain("Context 2002 was signed off by Director");
    const remove = await call(relationRoute, "DELETE", { siteId: fx.site.id, relationId: r.id });
    expect(remove.status).toBe(409);
    expect(
      await db.select().from(schema.contextRelations).where(eq(schema.contextRelations.siteId, fx.site.id)),
    ).toHaveLength(1);
  });
});
