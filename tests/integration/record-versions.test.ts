import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { session } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";
import * as submitRoute from "@/app/api/sites/[siteId]/sign-off/[contextId]/submit/route";
import { insertFind } from "./role-cases/core";
import { completeSheet } from "./role-cases/sign-off";

type Mod = Record<string, (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>>;

async function send(
  mod: Mod,
  method: string,
  params: Record<string, string>,
  body?: unknown,
  headers: Record<string, string> = {},
) {
  const req = new Request("http://localhost/api/test", {
    method,
    headers: { "content-type": "application/json", ...headers },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const res = await mod[method](req, { params: Promise.resolve(params) });
  const text = await res.text();
  return { status: res.status, json: text ? JSON.parse(text) : null };
}

const rowOf = async (table: typeof schema.finds | typeof schema.contexts | typeof schema.trenches, id: string) => {
  const [row] = await (await getDb()).select().from(table).where(eq(table.id, id));
  return row as unknown as Record<string, unknown> & { version: number };
};

type Case = {
  what: string;
  mod: Mod;
  table: typeof schema.finds | typeof schema.contexts | typeof schema.trenches;
  target: (fx: SiteFixture) => Promise<{ id: string; params: Record<string, string> }>;
  edit: Record<string, unknown>;
};

const cases: Case[] = [
  {
    what: "find",
    mod: findRoute as Mod,
    table: schema.finds,
    target: async (fx) => {
      const f = await insertFind(fx);
      return { id: f.id, params: { siteId: fx.site.id, findId: f.id } };
    },
    edit: { description: "Flake, cortex on one face" },
  },
  {
    what: "context",
    mod: contextRoute as Mod,
    table: schema.contexts,
    target: async (fx) => ({ id: fx.context.id, params: { siteId: fx.site.id, contextId: fx.context.id } }),
    edit: { colour: "mid grey" },
  },
  {
    what: "trench",
    mod: trenchRoute as Mod,
    table: schema.trenches,
    target: async (fx) => ({ id: fx.trench.id, params: { siteId: fx.site.id, trenchId: fx.trench.id } }),
    edit: { name: "North extension" },
  },
];

describe("record versions: an edit made on an older version is refused with the record as it is now", () => {
  for (const c of cases) {
    it(`${c.what}: each change raises the version; If-Match with the current version is accepted`, async () => {
      const fx = await makeSite();
      const t = await c.target(fx);
      session.userId = fx.people.director.id;
      expect((await rowOf(c.table, t.id)).version).toBe(1);
      const first = await send(c.mod, "PATCH", t.params, c.edit, { "If-Match": '"1"' });
      expect(first.status, JSON.stringify(first.json)).toBe(200);
      expect(first.json.version).toBe(2);
      const unconditional = await send(c.mod, "PATCH", t.params, c.edit);
      expect(unconditional.json.version).toBe(3);
      const empty = await send(c.mod, "PATCH", t.params, {}, { "If-Match": "3" });
      expect([empty.status, empty.json.version]).toEqual([200, 3]);
    });

    it(`${c.what}: a stale PATCH → 409 stale with the current record, nothing changed`, async () => {
      const fx = await makeSite();
      const t = await c.target(fx);
      session.userId = fx.people.director.id;
      await send(c.mod, "PATCH", t.params, c.edit);
      const now = await rowOf(c.table, t.id);
      const stale = await send(
        c.mod,
        "PATCH",
        t.params,
        Object.fromEntries(Object.keys(c.edit).map((k) => [k, "older words"])),
        { "If-Match": '"1"' },
      );
      expect(stale.status).toBe(409);
      expect(stale.json.code).toBe("stale");
      expect(stale.json.error).toMatch(/version 1; it is now version 2/);
      expect(stale.json.details).toMatchObject({
        yourVersion: 1,
        currentVersion: 2,
        current: { id: t.id, version: 2, ...c.edit },
      });
      expect(await rowOf(c.table, t.id)).toEqual(now);
    });
  }

  it("a stale DELETE of a find is refused and the find stays", async () => {
    const fx = await makeSite();
    const f = await insertFind(fx);
    session.userId = fx.people.digger.id;
    await send(findRoute as Mod, "PATCH", { siteId: fx.site.id, findId: f.id }, { description: "edited" });
    const res = await send(findRoute as Mod, "DELETE", { siteId: fx.site.id, findId: f.id }, undefined, {
      "If-Match": '"1"',
    });
    expect([res.status, res.json.code]).toEqual([409, "stale"]);
    expect(await rowOf(schema.finds, f.id)).toBeDefined();
    const ok = await send(findRoute as Mod, "DELETE", { siteId: fx.site.id, findId: f.id }, undefined, {
      "If-Match": '"2"',
    });
    expect(ok.status).toBe(200);
  });

  it("a lock beats a version: a locked context answers locked, not stale", async () => {
    const fx = await makeSite();
    await completeSheet(fx.context.id);
    session.userId = fx.people.digger.id;
    const before = (await rowOf(schema.contexts, fx.context.id)).version;
    const submitted = await send(submitRoute as Mod, "POST", { siteId: fx.site.id, contextId: fx.context.id }, {});
    expect(submitted.status, JSON.stringify(submitted.json)).toBe(200);
    expect((await rowOf(schema.contexts, fx.context.id)).version).toBe(before + 1);
    const res = await send(
      contextRoute as Mod,
      "PATCH",
      { siteId: fx.site.id, contextId: fx.context.id },
      { colour: "grey" },
      { "If-Match": String(before) },
    );
    expect([res.status, res.json.code]).toEqual([409, "locked"]);
  });

  it("If-Match that is not a version → 400 naming the header", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const res = await send(
      contextRoute as Mod,
      "PATCH",
      { siteId: fx.site.id, contextId: fx.context.id },
      { colour: "grey" },
      { "If-Match": 'W/"abc"' },
    );
    expect(res.status).toBe(400);
    expect(Object.keys(res.json.fieldErrors)).toEqual(["If-Match"]);
    expect((await rowOf(schema.contexts, fx.context.id)).colour).toBe("");
  });
});
