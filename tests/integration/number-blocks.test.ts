import { describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { session } from "../support/harness";
import { makeSite, makeUser, type SiteFixture } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as blocksRoute from "@/app/api/sites/[siteId]/number-blocks/route";
import * as releaseRoute from "@/app/api/sites/[siteId]/number-blocks/[blockId]/release/route";
import * as accountingRoute from "@/app/api/sites/[siteId]/number-accounting/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import * as contextsRoute from "@/app/api/sites/[siteId]/contexts/route";
import * as siteRoute from "@/app/api/sites/[siteId]/route";
import * as discardsRoute from "@/app/api/sites/[siteId]/discards/route";

type Mod = Record<string, (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>>;

async function send(
  mod: unknown,
  method: string,
  params: Record<string, string>,
  body?: unknown,
  headers: Record<string, string> = {},
  query: Record<string, string> = {},
) {
  const url = new URL("http://localhost/api/test");
  for (const [k, v] of Object.entries(query)) url.searchParams.set(k, v);
  const req = new Request(url, {
    method,
    headers: { "content-type": "application/json", ...headers },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const res = await (mod as Mod)[method]!(req, { params: Promise.resolve(params) });
  const text = await res.text();
  return { status: res.status, json: text ? JSON.parse(text) : null };
}

const reserve = (fx: SiteFixture, kind: "find" | "context", deviceId = randomUUID(), deviceLabel = "Tablet 1") =>
  send(blocksRoute, "POST", { siteId: fx.site.id }, { kind, deviceId, deviceLabel });
const recordFind = (fx: SiteFixture, extra: Record<string, unknown> = {}) =>
  send(
    findsRoute,
    "POST",
    { siteId: fx.site.id },
    { contextId: fx.context.id, classId: fx.cls.id, x: 1, y: 1, ...extra },
  );
const accounting = (fx: SiteFixture, kind = "find") =>
  send(accountingRoute, "GET", { siteId: fx.site.id }, undefined, {}, { kind });
const findCount = async (fx: SiteFixture) =>
  (await (await getDb()).select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id))).length;

describe("blocks of find numbers held by a device", () => {
  it("a block is the next 50 numbers; finds recorded online afterwards are numbered past it", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    expect((await recordFind(fx)).json.number).toBe(1);
    const block = await reserve(fx, "find");
    expect(block.status, JSON.stringify(block.json)).toBe(201);
    expect(block.json).toMatchObject({
      kind: "find",
      first: 2,
      last: 51,
      size: 50,
      left: 50,
      deviceLabel: "Tablet 1",
      userId: fx.people.digger.id,
    });
    expect(block.json.free).toHaveLength(50);
    expect((await recordFind(fx)).json.number).toBe(52);
  });

  it("the director sets the block size; the device id may come as the Loamwork-Device header", async () => {
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    expect((await send(siteRoute, "PATCH", { siteId: fx.site.id }, { numberBlockSize: 20 })).status).toBe(200);
    session.userId = fx.people.digger.id;
    const device = randomUUID();
    const res = await send(
      blocksRoute,
      "POST",
      { siteId: fx.site.id },
      { kind: "find" },
      { "Loamwork-Device": device },
    );
    expect(res.json).toMatchObject({ first: 1, last: 20, size: 20, deviceId: device });
    const none = await send(blocksRoute, "POST", { siteId: fx.site.id }, { kind: "find" });
    expect(none.status).toBe(400);
    expect(Object.keys(none.json.fieldErrors)).toEqual(["deviceId"]);
    session.userId = fx.people.digger.id;
    const refused = await send(siteRoute, "PATCH", { siteId: fx.site.id }, { numberBlockSize: 200 });
    expect(refused.status).toBe(403);
  });

  it("a specialist without the digger role cannot hold numbers", async () => {
    const fx = await makeSite();
    session.userId = fx.people.specialist.id;
    const res = await reserve(fx, "find");
    expect(res.status).toBe(403);
    expect(res.json.code).toBe("forbidden");
    const [site] = await (await getDb()).select().from(schema.sites).where(eq(schema.sites.id, fx.site.id));
    expect(site!.nextFindNumber).toBe(1);
  });

  it("a find sent with a number of the sender's block keeps it; other numbers are refused with the reason", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const mine = (await reserve(fx, "find")).json;
    session.userId = fx.people.director.id;
    const theirs = (await reserve(fx, "find", randomUUID(), "Director's phone")).json;
    session.userId = fx.people.digger.id;
    const taken = await recordFind(fx, { number: mine.first + 4 });
    expect([taken.status, taken.json.number]).toEqual([201, mine.first + 4]);

    const cases: [number, string, RegExp][] = [
      [theirs.first, "number-reserved", /reserved for Director on Director's phone/],
      [theirs.last + 10, "number-not-held", /not in a block of numbers you hold/],
      [mine.first + 4, "number-not-held", /already used/],
    ];
    for (const [number, code, message] of cases) {
      const before = await findCount(fx);
      const res = await recordFind(fx, { number });
      expect([res.status, res.json.code], JSON.stringify(res.json)).toEqual([409, code]);
      expect(res.json.error).toMatch(message);
      expect(await findCount(fx)).toBe(before);
    }
    const listed = await send(blocksRoute, "GET", { siteId: fx.site.id }, undefined, {}, {});
    expect(listed.json).toHaveLength(1);
    expect(listed.json[0]).toMatchObject({ id: mine.id, left: 49 });
    expect(listed.json[0].free).not.toContain(mine.first + 4);
  });

  it("giving a block back voids its unused numbers, with who held them and why; a void number is never used", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const block = (await reserve(fx, "find")).json;
    await recordFind(fx, { number: block.first });
    await recordFind(fx, { number: block.first + 2 });
    session.userId = fx.people.director.id;
    const released = await send(
      releaseRoute,
      "POST",
      { siteId: fx.site.id, blockId: block.id },
      { reason: "Tablet dropped in the spoil heap" },
    );
    expect(released.status, JSON.stringify(released.json)).toBe(200);
    expect(released.json.voided).toBe(48);
    session.userId = fx.people.digger.id;
    const late = await recordFind(fx, { number: block.first + 1 });
    expect([late.status, late.json.code]).toEqual([409, "number-void"]);
    expect(late.json.error).toMatch(/Tablet dropped in the spoil heap/);
    const again = await send(releaseRoute, "POST", { siteId: fx.site.id, blockId: block.id }, { reason: "twice" });
    expect(again.status).toBe(409);

    const acc = (await accounting(fx)).json;
    expect(acc.ranges).toEqual([
      { first: 1, last: 1, status: "find" },
      {
        first: 2,
        last: 2,
        status: "void",
        reason: "Block given back: Tablet dropped in the spoil heap",
        holder: "Digger",
        by: "Director",
      },
      { first: 3, last: 3, status: "find" },
      {
        first: 4,
        last: 50,
        status: "void",
        reason: "Block given back: Tablet dropped in the spoil heap",
        holder: "Digger",
        by: "Director",
      },
    ]);
    expect(acc.totals).toMatchObject({ find: 2, void: 48, reserved: 0, unassigned: 0 });
  });

  it("another digger cannot give back someone else's block", async () => {
    const fx = await makeSite();
    const other = await makeUser("Second digger");
    await (await getDb()).insert(schema.memberships).values({ siteId: fx.site.id, userId: other.id, role: "digger" });
    session.userId = fx.people.digger.id;
    const block = (await reserve(fx, "find")).json;
    session.userId = other.id;
    const res = await send(releaseRoute, "POST", { siteId: fx.site.id, blockId: block.id }, { reason: "Not mine" });
    expect(res.status).toBe(403);
    const [row] = await (await getDb()).select().from(schema.numberBlocks).where(eq(schema.numberBlocks.id, block.id));
    expect(row!.releasedAt).toBeNull();
  });

  it("a deleted find's number is void, naming who deleted it", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const f = (await recordFind(fx)).json;
    expect((await send(findRoute, "DELETE", { siteId: fx.site.id, findId: f.id })).status).toBe(200);
    const acc = (await accounting(fx)).json;
    expect(acc.ranges).toEqual([
      { first: 1, last: 1, status: "void", reason: "find deleted", holder: "Digger", by: "Digger" },
    ]);
  });

  it("samples sharing the finds' sequence are counted as samples", async () => {
    const fx = await makeSite();
    const db = await getDb();
    await db
      .update(schema.sites)
      .set({ samplesShareFindNumbers: true, nextFindNumber: 3 })
      .where(eq(schema.sites.id, fx.site.id));
    await db.insert(schema.samples).values({
      siteId: fx.site.id,
      trenchId: fx.trench.id,
      contextId: fx.context.id,
      number: 2,
      type: "bulk",
      takenOn: "2026-07-01",
    });
    session.userId = fx.people.digger.id;
    await recordFind(fx);
    const acc = (await accounting(fx)).json;
    expect(acc.ranges).toEqual([
      { first: 1, last: 1, status: "unassigned" },
      { first: 2, last: 2, status: "sample" },
      { first: 3, last: 3, status: "find" },
    ]);
  });
});

describe("blocks of context numbers", () => {
  it("start past the highest context number; a number in another's block is refused, one's own accepted", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const block = (await reserve(fx, "context")).json;
    expect(block).toMatchObject({ kind: "context", first: fx.context.number + 1, size: 50 });
    const own = await send(
      contextsRoute,
      "POST",
      { siteId: fx.site.id },
      { trenchId: fx.trench.id, number: block.first + 1, type: "fill" },
    );
    expect(own.status, JSON.stringify(own.json)).toBe(201);
    session.userId = fx.people.director.id;
    const other = await send(
      contextsRoute,
      "POST",
      { siteId: fx.site.id },
      { trenchId: fx.trench.id, number: block.first, type: "fill" },
    );
    expect([other.status, other.json.code]).toEqual([409, "number-reserved"]);
    const past = await send(
      contextsRoute,
      "POST",
      { siteId: fx.site.id },
      { trenchId: fx.trench.id, number: block.last + 1, type: "cut" },
    );
    expect(past.status).toBe(201);
    session.userId = fx.people.digger.id;
    const next = (await reserve(fx, "context")).json;
    expect(next.first).toBe(block.last + 2);
    const acc = (await accounting(fx, "context")).json;
    expect(acc.totals).toMatchObject({ context: 3, reserved: 99, void: 0 });
    expect(acc.ranges[0]).toEqual({ first: 1, last: fx.context.number - 1, status: "unassigned" });
  });
});

describe("several devices at once", () => {
  it("no number is given twice and every number from 1 to the highest is accounted for", async () => {
    const fx = await makeSite();
    const db = await getDb();
    const diggers = [fx.people.digger];
    for (let i = 0; i < 5; i++) {
      const u = await makeUser(`Digger ${i}`);
      await db.insert(schema.memberships).values({ siteId: fx.site.id, userId: u.id, role: "digger" });
      diggers.push(u);
    }
    // Twelve tablets reserve a block each while finds are recorded online, all at the same moment. (The mocked
    // session is one global, so concurrent calls may all run as the last digger set; the devices differ.)
    const work: Promise<{ status: number; json: any }>[] = [];
    for (const d of diggers) {
      for (let k = 0; k < 2; k++) {
        work.push(
          (async () => {
            session.userId = d.id;
            return reserve(fx, "find", randomUUID(), `${d.name} tablet ${k}`);
          })(),
        );
      }
      work.push(
        (async () => {
          session.userId = d.id;
          return recordFind(fx);
        })(),
      );
    }
    const answers = await Promise.all(work);
    expect(answers.map((a) => a.status).sort()).toEqual([...Array(12).fill(201), ...Array(6).fill(201)]);
    const blocks = await db.select().from(schema.numberBlocks).where(eq(schema.numberBlocks.siteId, fx.site.id));
    const found = await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id));
    const handedOut = [
      ...blocks.flatMap((b) => Array.from({ length: b.last - b.first + 1 }, (_, i) => b.first + i)),
      ...found.map((f) => f.number),
    ];
    expect(new Set(handedOut).size).toBe(handedOut.length);
    expect(handedOut.length).toBe(12 * 50 + 6);
    expect(new Set(blocks.map((b) => b.deviceId)).size).toBe(12);

    // Each device records a few finds from its block; one gives its block back.
    for (const b of blocks.slice(0, 4)) {
      session.userId = b.userId;
      for (let i = 0; i < 3; i++) expect((await recordFind(fx, { number: b.first + i * 7 })).status).toBe(201);
    }
    session.userId = blocks[0]!.userId;
    await send(releaseRoute, "POST", { siteId: fx.site.id, blockId: blocks[0]!.id }, { reason: "Season over" });

    const acc = (await accounting(fx)).json;
    expect(acc.highest).toBe(12 * 50 + 6);
    expect(acc.overlaps).toEqual([]);
    let next = 1;
    for (const r of acc.ranges) {
      expect(r.first).toBe(next);
      next = r.last + 1;
    }
    expect(next).toBe(acc.highest + 1);
    expect(acc.totals).toEqual({ find: 6 + 12, sample: 0, context: 0, reserved: 11 * 50 - 9, void: 47, unassigned: 0 });
  });
});

describe("discarding a refused operation", () => {
  it("is recorded on the audit trail with what it would have written; an accepted operation cannot be discarded", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const key = randomUUID();
    const body = {
      idempotencyKey: key,
      operation: "findsCreate",
      method: "POST",
      path: `/api/sites/${fx.site.id}/finds`,
      reasonCode: "locked",
      reason: "Context 1001 was signed off.",
      note: "Bagged again under the right context",
      body: { x: 1.5, y: 2 },
    };
    const res = await send(discardsRoute, "POST", { siteId: fx.site.id }, body, {
      "Loamwork-Device": "0b7f3f8e-5d0a-4a43-9a4e-0c7c1f7b1c11",
    });
    expect([res.status, res.json]).toEqual([201, { discarded: key }]);
    const db = await getDb();
    const [entry] = await db.select().from(schema.auditEntries).where(eq(schema.auditEntries.recordId, key));
    expect(entry).toMatchObject({
      action: "discard",
      recordType: "operation",
      actorId: fx.people.digger.id,
      reason: "Bagged again under the right context",
    });
    expect(entry!.after).toMatchObject({
      operation: "findsCreate",
      reasonCode: "locked",
      body: { x: 1.5, y: 2 },
      deviceId: "0b7f3f8e-5d0a-4a43-9a4e-0c7c1f7b1c11",
    });

    const accepted = randomUUID();
    expect(
      (
        await send(
          findsRoute,
          "POST",
          { siteId: fx.site.id },
          { contextId: fx.context.id, classId: fx.cls.id, x: 1, y: 1 },
          { "Idempotency-Key": accepted },
        )
      ).status,
    ).toBe(201);
    const refused = await send(discardsRoute, "POST", { siteId: fx.site.id }, { ...body, idempotencyKey: accepted });
    expect(refused.status).toBe(409);
    expect(refused.json.error).toMatch(/already accepted/);
  });
});
