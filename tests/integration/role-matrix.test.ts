import { describe, expect, it } from "vitest";
import { session, call } from "../support/harness";
import { makeSite, makeUser, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { api, type ApiOperation } from "@/lib/server/api-catalog";
import * as sitesRoute from "@/app/api/sites/route";
import * as siteRoute from "@/app/api/sites/[siteId]/route";
import * as membersRoute from "@/app/api/sites/[siteId]/members/route";
import * as memberRoute from "@/app/api/sites/[siteId]/members/[userId]/route";
import * as classesRoute from "@/app/api/sites/[siteId]/classes/route";
import * as classRoute from "@/app/api/sites/[siteId]/classes/[classId]/route";
import * as trenchesRoute from "@/app/api/sites/[siteId]/trenches/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";
import * as contextsRoute from "@/app/api/sites/[siteId]/contexts/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";

type Prepared = { mod: any; params: Record<string, string>; body?: unknown };
let counter = 0;

/** For each mutating operation: a fresh target and a valid input, so only the caller decides the outcome. */
const writes: Partial<Record<keyof typeof api, (fx: SiteFixture) => Promise<Prepared>>> = {
  sitesCreate: async () => ({ mod: sitesRoute, params: {}, body: { code: `NEW-${++counter}`, name: "New site" } }),
  siteUpdate: async (fx) => ({ mod: siteRoute, params: { siteId: fx.site.id }, body: { name: `Renamed ${++counter}` } }),
  membersAdd: async (fx) => {
    const u = await makeUser("Newcomer");
    return { mod: membersRoute, params: { siteId: fx.site.id }, body: { email: u.email, role: "digger" } };
  },
  memberUpdate: async (fx) => {
    const u = await makeUser("Member");
    const db = await getDb();
    await db.insert(schema.memberships).values({ siteId: fx.site.id, userId: u.id, role: "digger" });
    return { mod: memberRoute, params: { siteId: fx.site.id, userId: u.id }, body: { role: "specialist" } };
  },
  memberRemove: async (fx) => {
    const u = await makeUser("Leaver");
    const db = await getDb();
    await db.insert(schema.memberships).values({ siteId: fx.site.id, userId: u.id, role: "digger" });
    return { mod: memberRoute, params: { siteId: fx.site.id, userId: u.id } };
  },
  classesCreate: async (fx) => ({ mod: classesRoute, params: { siteId: fx.site.id }, body: { code: `C${++counter}`, label: "Burnt bone", colour: "#d55e00", symbol: "square" } }),
  classUpdate: async (fx) => ({ mod: classRoute, params: { siteId: fx.site.id, classId: fx.cls.id }, body: { label: `Flint ${++counter}` } }),
  trenchesCreate: async (fx) => ({
    mod: trenchesRoute,
    params: { siteId: fx.site.id },
    body: { code: `B${++counter}`, outline: { type: "Polygon", coordinates: [[[0, 0], [4, 0], [4, 3], [0, 3], [0, 0]]] } },
  }),
  trenchUpdate: async (fx) => ({ mod: trenchRoute, params: { siteId: fx.site.id, trenchId: fx.trench.id }, body: { name: `North ${++counter}` } }),
  trenchDelete: async (fx) => {
    const db = await getDb();
    const [t] = await db.insert(schema.trenches).values({ siteId: fx.site.id, code: `D${++counter}`, outline: { type: "Polygon", coordinates: [[[0, 0], [1, 0], [1, 1], [0, 0]]] } }).returning();
    return { mod: trenchRoute, params: { siteId: fx.site.id, trenchId: t.id } };
  },
  contextsCreate: async (fx) => ({ mod: contextsRoute, params: { siteId: fx.site.id }, body: { trenchId: fx.trench.id, number: 5000 + ++counter, type: "fill" } }),
  contextUpdate: async (fx) => ({ mod: contextRoute, params: { siteId: fx.site.id, contextId: fx.context.id }, body: { colour: `mid brown ${++counter}` } }),
  contextDelete: async (fx) => {
    const db = await getDb();
    const [c] = await db.insert(schema.contexts).values({ siteId: fx.site.id, trenchId: fx.trench.id, number: 7000 + ++counter, type: "cut" }).returning();
    return { mod: contextRoute, params: { siteId: fx.site.id, contextId: c.id } };
  },
  findsCreate: async (fx) => ({ mod: findsRoute, params: { siteId: fx.site.id }, body: { contextId: fx.context.id, classId: fx.cls.id, x: 1.5, y: 1.5 } }),
  findUpdate: async (fx) => {
    const f = await insertFind(fx);
    return { mod: findRoute, params: { siteId: fx.site.id, findId: f.id }, body: { description: "re-examined" } };
  },
  findDelete: async (fx) => {
    const f = await insertFind(fx);
    return { mod: findRoute, params: { siteId: fx.site.id, findId: f.id } };
  },
};

async function insertFind(fx: SiteFixture) {
  const db = await getDb();
  const [f] = await db
    .insert(schema.finds)
    .values({ siteId: fx.site.id, trenchId: fx.trench.id, contextId: fx.context.id, classId: fx.cls.id, number: 90000 + ++counter, x: 1, y: 1, method: "typed" })
    .returning();
  return f;
}

/** Every row of every table except the append-only audit trail, as JSON, to prove a refusal changed nothing. */
async function snapshot(): Promise<string> {
  const db = await getDb();
  const tables = [schema.sites, schema.memberships, schema.users, schema.trenches, schema.contexts, schema.contextRelations, schema.artefactClasses, schema.finds];
  const parts = [];
  for (const t of tables) parts.push(JSON.stringify(await db.select().from(t)));
  const audit = await db.select().from(schema.auditEntries);
  parts.push(String(audit.length));
  return parts.join("\n");
}

const callers = ["signed-out", "stranger", "digger", "specialist", "director"] as const;

function expectedStatus(op: ApiOperation, who: (typeof callers)[number]): number {
  if (who === "signed-out") return 401;
  if (!op.roles) return op.successStatus ?? 200;
  if (who === "stranger") return 404;
  if (op.roles === "member" || op.roles.includes(who)) return op.successStatus ?? 200;
  return 403;
}

describe("every mutating route × every caller", () => {
  const mutating = (Object.entries(api) as [keyof typeof api, ApiOperation][]).filter(([, op]) => op.method !== "GET");

  it("has a case for every mutating operation in the catalogue", () => {
    expect(mutating.map(([name]) => name).sort()).toEqual(Object.keys(writes).sort());
  });

  for (const [name, op] of mutating) {
    for (const who of callers) {
      const want = expectedStatus(op, who);
      it(`${op.method} ${op.path} as ${who} → ${want}`, async () => {
        const fx = await makeSite();
        const prepared = await writes[name]!(fx);
        session.userId = who === "signed-out" ? null : fx.people[who].id;
        const before = await snapshot();
        const res = await call(prepared.mod, op.method, prepared.params, prepared.body);
        expect(res.status, JSON.stringify(res.json)).toBe(want);
        if (want >= 400) {
          expect(typeof res.json.error).toBe("string");
          expect(await snapshot()).toBe(before);
        } else {
          expect(await snapshot()).not.toBe(before);
        }
      });
    }
  }
});
