import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import * as trenchRoute from "@/app/api/sites/[siteId]/trenches/[trenchId]/route";
import * as relationRoute from "@/app/api/sites/[siteId]/relations/[relationId]/route";
import * as contextsRoute from "@/app/api/sites/[siteId]/contexts/route";
import { getFind } from "@/lib/server/finds";
import { getContext } from "@/lib/server/contexts";
import { getTrench } from "@/lib/server/trenches";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { api, type ApiOperation } from "@/lib/server/api-catalog";
import { coreCases } from "./role-cases/core";
import { levelsCases } from "./role-cases/levels";
import { offlineCases } from "./role-cases/offline";
import { patternsCases } from "./role-cases/patterns";
import { planCases } from "./role-cases/plan";
import { recordingCases } from "./role-cases/recording";
import { signOffCases } from "./role-cases/sign-off";
import type { Prepared } from "./role-cases/types";

const writes: Record<string, (fx: SiteFixture) => Promise<Prepared>> = {
  ...coreCases,
  ...planCases,
  ...recordingCases,
  ...signOffCases,
  ...patternsCases,
  ...levelsCases,
  ...offlineCases,
};

type RouteModule = Record<
  string,
  (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>
>;
const routeFiles = import.meta.glob<RouteModule>("/app/api/**/route.ts");

/** The route module serving a catalogue path: /api/sites/{siteId}/finds → app/api/sites/[siteId]/finds/route.ts. */
async function routeOf(path: string): Promise<RouteModule> {
  const file = `/app${path.replace(/\{(\w+)\}/g, "[$1]")}/route.ts`;
  const load = routeFiles[file];
  if (!load) throw new Error(`no route file ${file} for ${path}`);
  return load();
}

/** Sends a raw body (any text, not only JSON) the way Next calls a handler. */
async function send(
  mod: RouteModule,
  method: string,
  params: Record<string, string>,
  body: string | undefined,
  query: Record<string, string>,
) {
  const url = new URL("http://localhost/api/test");
  for (const [k, v] of Object.entries(query)) url.searchParams.set(k, v);
  const req = new Request(url, {
    method,
    headers: { "content-type": "application/json" },
    body: method === "GET" ? undefined : body,
  });
  const res = await mod[method](req, { params: Promise.resolve(params) });
  const text = await res.text();
  return { status: res.status, text };
}

const nul = "\u0000";
/** Ids as a script, a typo or an attacker might put them in a URL. */
const badId = fc.oneof(
  fc.constantFrom(
    "abc",
    "0",
    "1",
    "-1",
    "null",
    "undefined",
    "..",
    "%00",
    nul,
    `${nul}x`,
    "00000000-0000-0000-0000-00000000000g",
    "'; drop table finds; --",
    "9".repeat(40),
    " ",
  ),
  fc.string({ maxLength: 40 }),
  fc.uuid(),
);
/** Values that once were coerced, overflowed a column or could not be stored. */
const oddValue = fc.oneof(
  fc.constantFrom(
    null,
    true,
    false,
    [],
    {},
    "",
    nul,
    `a${nul}b`,
    2147483647,
    2147483648,
    -2147483649,
    1e308,
    -1e308,
    "0x3",
    "NaN",
    "Infinity",
    [3],
    { a: 1 },
    "2026-13-45",
    "x".repeat(5000),
  ),
  fc.string({ maxLength: 30 }).map((s) => `${s}${nul}`),
  fc.double(),
  fc.integer(),
  fc.uuid(),
);
const rawText = fc.constantFrom(
  "{}",
  "{",
  "[",
  "null",
  "true",
  "0",
  '"x"',
  `{"a":"${"\\u0000"}"}`,
  "\u0000",
  "{}}",
  "[1,2",
  "",
);

function bodyArb(valid: unknown): fc.Arbitrary<string | undefined> {
  const asObject =
    valid && typeof valid === "object" && !Array.isArray(valid) ? (valid as Record<string, unknown>) : {};
  const keys = Object.keys(asObject);
  const mutated = keys.length
    ? fc
        .record({ key: fc.constantFrom(...keys), value: oddValue })
        .map(({ key, value }) => JSON.stringify({ ...asObject, [key]: value }))
    : oddValue.map((v) => JSON.stringify({ value: v }));
  const deep = fc
    .record({ key: fc.constantFrom(...(keys.length ? keys : ["x"])), value: fc.anything() })
    .map(({ key, value }) => JSON.stringify({ ...asObject, [key]: value }));
  return fc.oneof(
    { weight: 3, arbitrary: mutated },
    { weight: 1, arbitrary: deep },
    { weight: 1, arbitrary: fc.anything().map((v) => JSON.stringify(v)) },
    { weight: 1, arbitrary: rawText },
    { weight: 1, arbitrary: fc.constant(valid === undefined ? undefined : JSON.stringify(valid)) },
  );
}

const queryArb = fc.dictionary(
  fc.constantFrom(
    "page",
    "pageSize",
    "trenchId",
    "contextId",
    "classId",
    "q",
    "sort",
    "dir",
    "from",
    "to",
    "format",
    "space",
    "limit",
    "recordId",
    "ids",
    "x",
  ),
  fc.oneof(
    fc.string({ maxLength: 20 }),
    oddValue.map((v) => String(v)),
  ),
  { maxKeys: 4 },
);

const operations = (Object.entries(api) as [string, ApiOperation][]).sort(([a], [b]) => a.localeCompare(b));

describe("no catalogued route answers 500 to bad ids, bodies or queries", () => {
  for (const [name, op] of operations) {
    it(`${op.method} ${op.path}`, async () => {
      const mod = await routeOf(op.path);
      const fx = await makeSite();
      const prepared = writes[name] ? await writes[name](fx) : undefined;
      const valid: Record<string, string> = {
        siteId: fx.site.id,
        trenchId: fx.trench.id,
        contextId: fx.context.id,
        classId: fx.cls.id,
        userId: fx.people.digger.id,
        variant: "display",
        ...prepared?.params,
      };
      // A run's event stream stays open while the run lives: only unknown or malformed run ids there.
      if (name === "runEvents") delete valid.runId;
      const names = [...op.path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
      const paramsArb = fc.record(
        Object.fromEntries(
          names.map((p) => [
            p,
            valid[p]
              ? fc.oneof({ weight: 2, arbitrary: fc.constant(valid[p]) }, { weight: 1, arbitrary: badId })
              : badId,
          ]),
        ),
      );
      session.userId = op.public ? null : fx.people.director.id;
      await fc.assert(
        fc.asyncProperty(paramsArb, bodyArb(prepared?.body), queryArb, async (params, body, query) => {
          const res = await send(
            mod,
            op.method,
            params as Record<string, string>,
            op.method === "GET" || op.method === "DELETE" ? undefined : body,
            op.method === "GET" ? query : {},
          );
          expect(
            res.status,
            `${op.method} ${JSON.stringify(params)} ${body?.slice(0, 200)} → ${res.text.slice(0, 300)}`,
          ).toBeLessThan(500);
        }),
        { seed: 20261203, numRuns: 25 },
      );
    });
  }
});

describe("malformed ids are 404, NUL characters 400", () => {
  const cases: [string, RouteModule, string, string][] = [
    ["GET …/finds/abc", findRoute as RouteModule, "GET", "findId"],
    ["PATCH …/finds/abc", findRoute as RouteModule, "PATCH", "findId"],
    ["GET …/contexts/abc", contextRoute as RouteModule, "GET", "contextId"],
    ["DELETE …/contexts/abc", contextRoute as RouteModule, "DELETE", "contextId"],
    ["GET …/trenches/abc", trenchRoute as RouteModule, "GET", "trenchId"],
    ["PATCH …/trenches/abc", trenchRoute as RouteModule, "PATCH", "trenchId"],
    ["DELETE …/relations/abc", relationRoute as RouteModule, "DELETE", "relationId"],
  ];
  for (const [what, mod, method, param] of cases) {
    it(`${what} → 404 saying the record was not found`, async () => {
      const fx = await makeSite();
      session.userId = fx.people.director.id;
      const res = await call(
        mod,
        method,
        { siteId: fx.site.id, [param]: "abc" },
        method === "PATCH" ? { name: "x" } : undefined,
      );
      expect(res.status).toBe(404);
      expect(res.json.error).toMatch(/^That .+ was not found\.$/);
    });
  }

  it("the reads behind the find, context and trench pages treat a malformed id as not found", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await expect(getFind(db, fx.site.id, "abc")).rejects.toMatchObject({
      status: 404,
      message: "That find was not found.",
    });
    await expect(getContext(db, fx.site.id, "abc")).rejects.toMatchObject({
      status: 404,
      message: "That context was not found.",
    });
    await expect(getTrench(db, fx.site.id, "abc")).rejects.toMatchObject({
      status: 404,
      message: "That trench was not found.",
    });
  });

  it("a site id that is not a UUID is 404 too", async () => {
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    const res = await call(contextsRoute, "GET", { siteId: "abc" });
    expect(res.status).toBe(404);
  });

  it("a NUL character in a text field → 400 naming the field, nothing written", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const res = await call(
      contextRoute,
      "PATCH",
      { siteId: fx.site.id, contextId: fx.context.id },
      { colour: "dark\u0000brown", description: "ok" },
    );
    expect(res.status).toBe(400);
    expect(Object.keys(res.json.fieldErrors)).toEqual(["colour"]);
    expect(res.json.error).toContain("NUL");
    const db = await getDb();
    const [row] = await db.select().from(schema.contexts).where(eq(schema.contexts.id, fx.context.id));
    expect([row.colour, row.description]).toEqual(["", ""]);
  });
});
