import { describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { and, eq, getTableName, is, sql } from "drizzle-orm";
import { PgTable } from "drizzle-orm/pg-core";
import { session } from "../support/harness";
import { makeSite, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { api, type ApiOperation } from "@/lib/server/api-catalog";
import { purgeExpiredIdempotencyKeys } from "@/lib/server/idempotency";
import { runsIdle } from "@/lib/server/jobs/run-queue";
import { packagesIdle } from "@/lib/server/jobs/package-queue";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as contextRoute from "@/app/api/sites/[siteId]/contexts/[contextId]/route";
import type { Prepared, RoleCases } from "./role-cases/types";

/** Every role case of every feature (the role matrix's own list), so a new write is walked here too. */
// Loaded after the harness has mocked the session (an eager glob would be hoisted above that).
const caseModules = await Promise.all(
  Object.values(import.meta.glob<Record<string, unknown>>("./role-cases/*.ts")).map((load) => load()),
);
const writes: Record<string, (fx: SiteFixture) => Promise<Prepared>> = Object.assign(
  {},
  ...caseModules.flatMap((m) =>
    Object.entries(m)
      .filter(([name]) => name.endsWith("Cases"))
      .map(([, cases]) => cases as RoleCases),
  ),
);

const tableNames = (Object.values(schema) as unknown[])
  .filter((t): t is PgTable => is(t, PgTable))
  .map(getTableName)
  .filter((n) => n !== "idempotency_keys");

/** A digest of every row of every table but the keys themselves: a replay must leave all of it as it was. */
async function snapshot(): Promise<string> {
  const db = await getDb();
  const parts = tableNames.map((n) =>
    sql.raw(`(select count(*) || ':' || coalesce(md5(string_agg(t::text, '|' order by t::text)), '') from "${n}" t)`),
  );
  const { rows } = (await db.execute(sql`select concat_ws(' ', ${sql.join(parts, sql`, `)}) as digest`)) as unknown as {
    rows: { digest: string }[];
  };
  return rows[0].digest;
}

type Sent = { status: number; text: string; replayed: string | null };

/** Calls a route handler the way Next does, with the headers given. */
async function send(
  prepared: Prepared,
  method: string,
  headers: Record<string, string>,
  body: string | undefined,
): Promise<Sent> {
  const url = new URL("http://localhost/api/test");
  for (const [k, v] of Object.entries(prepared.query ?? {})) url.searchParams.set(k, v);
  const req = new Request(url, { method, headers: { "content-type": "application/json", ...headers }, body });
  const res = await prepared.mod[method](req, { params: Promise.resolve(prepared.params) });
  await runsIdle();
  await packagesIdle();
  return { status: res.status, text: await res.text(), replayed: res.headers.get("Idempotent-Replayed") };
}

const bodyOf = (p: Prepared) => (p.body === undefined ? undefined : JSON.stringify(p.body));

/** A member allowed to make the write (the director where allowed, as the role matrix's success case). */
function callerFor(op: ApiOperation, fx: SiteFixture): string {
  if (!op.roles || op.roles === "member" || op.roles.includes("director")) return fx.people.director.id;
  return fx.people[op.roles[0]].id;
}

describe("every mutating operation of the catalogue, sent twice with one Idempotency-Key", () => {
  const mutating = (Object.entries(api) as [string, ApiOperation][]).filter(
    ([, op]) => op.method !== "GET" && !op.public,
  );

  it("walks every mutating operation", () => {
    expect(mutating.map(([name]) => name).sort()).toEqual(Object.keys(writes).sort());
  });

  for (const [name, op] of mutating) {
    it(`${op.method} ${op.path}: the replay gets the first answer and writes nothing`, async () => {
      const fx = await makeSite();
      const prepared = await writes[name](fx);
      session.userId = callerFor(op, fx);
      const key = randomUUID();
      const before = await snapshot();
      const first = await send(prepared, op.method, { "Idempotency-Key": key }, bodyOf(prepared));
      expect(first.status, first.text).toBe(op.successStatus ?? 200);
      expect(first.replayed).toBeNull();
      const afterFirst = await snapshot();
      expect(afterFirst).not.toBe(before);

      const again = await send(prepared, op.method, { "Idempotency-Key": `"${key}"` }, bodyOf(prepared));
      expect(again).toEqual({ status: first.status, text: first.text, replayed: "true" });
      expect(await snapshot()).toBe(afterFirst);

      const other = await send(
        prepared,
        op.method,
        { "Idempotency-Key": key },
        JSON.stringify({ ...(prepared.body as object), somethingElse: 1 }),
      );
      expect(other.status, other.text).toBe(422);
      expect(JSON.parse(other.text).code).toBe("idempotency-key-reused");
      expect(await snapshot()).toBe(afterFirst);
    });
  }
});

describe("Idempotency-Key", () => {
  const findBody = (fx: SiteFixture) => JSON.stringify({ contextId: fx.context.id, classId: fx.cls.id, x: 2, y: 1 });
  const findsOf = async (fx: SiteFixture) =>
    (await getDb()).select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id));

  it("the same key sent twice at once writes once; both get the first answer", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const key = randomUUID();
    const prepared = { mod: findsRoute, params: { siteId: fx.site.id } };
    const answers = await Promise.all(
      [1, 2, 3].map(() => send(prepared, "POST", { "Idempotency-Key": key }, findBody(fx))),
    );
    expect(answers.map((a) => a.status)).toEqual([201, 201, 201]);
    expect(new Set(answers.map((a) => a.text)).size).toBe(1);
    expect(answers.filter((a) => a.replayed === "true")).toHaveLength(2);
    expect(await findsOf(fx)).toHaveLength(1);
  });

  it("keys are per user: another user's identical request with the same key is a write of its own", async () => {
    const fx = await makeSite();
    const key = randomUUID();
    const prepared = { mod: findsRoute, params: { siteId: fx.site.id } };
    session.userId = fx.people.digger.id;
    expect((await send(prepared, "POST", { "Idempotency-Key": key }, findBody(fx))).status).toBe(201);
    session.userId = fx.people.director.id;
    const second = await send(prepared, "POST", { "Idempotency-Key": key }, findBody(fx));
    expect([second.status, second.replayed]).toEqual([201, null]);
    expect(await findsOf(fx)).toHaveLength(2);
  });

  it("a refusal is not kept: once the context is reopened, the same key and body are accepted", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db
      .update(schema.contexts)
      .set({ state: "signed_off", signedOffAt: new Date(), signedOffBy: fx.people.director.id })
      .where(eq(schema.contexts.id, fx.context.id));
    session.userId = fx.people.digger.id;
    const key = randomUUID();
    const prepared = { mod: findsRoute, params: { siteId: fx.site.id } };
    const refused = await send(prepared, "POST", { "Idempotency-Key": key }, findBody(fx));
    expect(refused.status).toBe(409);
    expect(JSON.parse(refused.text).code).toBe("locked");
    await db.update(schema.contexts).set({ state: "open" }).where(eq(schema.contexts.id, fx.context.id));
    const accepted = await send(prepared, "POST", { "Idempotency-Key": key }, findBody(fx));
    expect([accepted.status, accepted.replayed]).toEqual([201, null]);
    expect(await findsOf(fx)).toHaveLength(1);
  });

  it("a key that is not a UUID → 400 naming the header, nothing written", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const before = await snapshot();
    const res = await send(
      { mod: findsRoute, params: { siteId: fx.site.id } },
      "POST",
      { "Idempotency-Key": "find-1" },
      findBody(fx),
    );
    expect(res.status).toBe(400);
    expect(JSON.parse(res.text)).toMatchObject({
      code: "idempotency-key-invalid",
      fieldErrors: { "Idempotency-Key": ["Not a UUID."] },
    });
    expect(await snapshot()).toBe(before);
  });

  it("a PATCH replayed after a later edit still answers its first answer and does not undo the later edit", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const key = randomUUID();
    const prepared = { mod: contextRoute, params: { siteId: fx.site.id, contextId: fx.context.id } };
    const first = await send(prepared, "PATCH", { "Idempotency-Key": key }, JSON.stringify({ colour: "grey" }));
    expect(first.status).toBe(200);
    expect((await send(prepared, "PATCH", {}, JSON.stringify({ colour: "brown" }))).status).toBe(200);
    const replay = await send(prepared, "PATCH", { "Idempotency-Key": key }, JSON.stringify({ colour: "grey" }));
    expect([replay.text, replay.replayed]).toEqual([first.text, "true"]);
    const [row] = await (await getDb()).select().from(schema.contexts).where(eq(schema.contexts.id, fx.context.id));
    expect(row.colour).toBe("brown");
  });

  it("keys are kept 30 days: an older key is forgotten, and the purge removes it", async () => {
    const fx = await makeSite();
    const db = await getDb();
    session.userId = fx.people.digger.id;
    const prepared = { mod: findsRoute, params: { siteId: fx.site.id } };
    const [oldKey, youngKey] = [randomUUID(), randomUUID()];
    for (const key of [oldKey, youngKey])
      expect((await send(prepared, "POST", { "Idempotency-Key": key }, findBody(fx))).status).toBe(201);
    const age = (days: number, key: string) =>
      db
        .update(schema.idempotencyKeys)
        .set({ createdAt: sql`now() - make_interval(days => ${days})` })
        .where(and(eq(schema.idempotencyKeys.userId, fx.people.digger.id), eq(schema.idempotencyKeys.key, key)));
    await age(31, oldKey);
    await age(29, youngKey);
    expect((await send(prepared, "POST", { "Idempotency-Key": youngKey }, findBody(fx))).replayed).toBe("true");
    expect((await findsOf(fx)).length).toBe(2);
    const third = await send(prepared, "POST", { "Idempotency-Key": oldKey }, findBody(fx));
    expect([third.status, third.replayed]).toEqual([201, null]);
    expect((await findsOf(fx)).length).toBe(3);
    await age(31, youngKey);
    expect(await purgeExpiredIdempotencyKeys(db)).toBeGreaterThanOrEqual(1);
    const left = await db.select().from(schema.idempotencyKeys).where(eq(schema.idempotencyKeys.key, youngKey));
    expect(left).toEqual([]);
  });
});
