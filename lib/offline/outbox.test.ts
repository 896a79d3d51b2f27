import "fake-indexeddb/auto";
import { describe, expect, it } from "vitest";
import { ApiError, NO_ANSWER, buildRequest } from "@/lib/api/client";
import { freeNumbers, refreshBlocks } from "./number-blocks";
import { Outbox } from "./outbox";
import { closeOutboxDb } from "./outbox-db";
import { backoffSeconds, damaged, syncOutbox } from "./sync";
import { createWritePath, isNetworkFailure } from "./write-path";
import { HELD_BLOCKS, classId, contextId, outboxPerTest, siteId, standInServer, trenchId } from "./test-device";

let userId = "";
let outbox: Outbox;
outboxPerTest("u", HELD_BLOCKS, (o, u) => {
  outbox = o;
  userId = u;
});

const find = (x: number) => buildRequest("findsCreate", { siteId }, { contextId, classId, x, y: 1, method: "plan" });

describe("the write path on a device", () => {
  it("offline, a find is queued with its own key and takes the lowest free number of the block", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const a = (await write(find(1))) as { id: string; number: number; pending: boolean };
    const b = (await write(find(2))) as { number: number };
    expect([a.number, b.number]).toEqual([501, 502]);
    expect(a.pending).toBe(true);
    const entries = await outbox.all();
    expect(entries.map((e) => e.label)).toEqual(["find #501", "find #502"]);
    expect(new Set(entries.map((e) => e.key)).size).toBe(2);
    expect(entries[0].key).toMatch(/^[0-9a-f-]{36}$/);
    expect(entries[0].localId).toBe(a.id);
  });

  it("editing or deleting a find not yet sent changes its queued create instead of queueing more", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const a = (await write(find(1))) as { id: string };
    const b = (await write(find(2))) as { id: string };
    await write(buildRequest("findUpdate", { siteId, findId: a.id }, { x: 3.25, description: "blade" }));
    const gone = (await write(buildRequest("findDelete", { siteId, findId: b.id }))) as {
      deleted: string;
      number: number;
    };
    expect(gone).toMatchObject({ deleted: b.id, number: 502 });
    const entries = await outbox.all();
    expect(entries).toHaveLength(1);
    expect(JSON.parse(entries[0].body!)).toMatchObject({ x: 3.25, description: "blade", number: 501 });
  });

  it("with no numbers held it refuses to record rather than invent one", async () => {
    await outbox.removeBlock("b1");
    const write = createWritePath({ outbox, online: () => false });
    await expect(write(find(1))).rejects.toThrow(/holds no find numbers/);
    expect(await outbox.all()).toHaveLength(0);
  });

  it("online with nothing waiting, a write goes straight to the server with an idempotency key", async () => {
    const s = standInServer();
    const write = createWritePath({ outbox, online: () => true, send: s.send });
    await write(find(1));
    expect(s.seen).toHaveLength(1);
    expect(s.seen[0].headers["idempotency-key"]).toMatch(/^[0-9a-f-]{36}$/);
    expect(await outbox.all()).toHaveLength(0);
  });

  it("a connection lost on the way queues the write with the same key", async () => {
    let key = "";
    const write = createWritePath({
      outbox,
      online: () => true,
      send: async (req) => {
        key = req.headers["idempotency-key"];
        throw new ApiError(NO_ANSWER, 0);
      },
    });
    await write(find(1));
    const [entry] = await outbox.all();
    expect(entry.key).toBe(key);
  });

  it("a write that cannot wait says it needs a connection and queues nothing", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await expect(write(buildRequest("siteUpdate", { siteId }, { name: "x" }))).rejects.toThrow(/needs a connection/);
    expect(await outbox.all()).toHaveLength(0);
  });

  it("runs the loop check on the device before a relation is queued", async () => {
    const write = createWritePath({ outbox, online: () => false, loopCheck: async () => "1 above 2 above 1" });
    await expect(
      write(buildRequest("relationsCreate", { siteId }, { contextId, reading: "above", otherId: classId })),
    ).rejects.toThrow(/loop/);
    expect(await outbox.all()).toHaveLength(0);
  });
});

describe("counts by square on a device", () => {
  const square = (col: number, count: number) =>
    buildRequest("squareRecord", { siteId, trenchId }, {
      col,
      row: 2,
      contextId,
      spitId: null,
      excavatedArea: null,
      counts: [{ classId, count, weightG: null }],
    } as never);

  it("offline, a square record is queued with its key and answered as pending; a delete too", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const made = (await write(square(3, 12))) as { id: string; col: number; pending: boolean };
    expect(made).toMatchObject({ col: 3, row: 2, pending: true });
    const sampleId = "7e57ab1e-0000-4000-8000-000000000001";
    expect(await write(buildRequest("squareDelete", { siteId, sampleId }))).toEqual({
      deleted: sampleId,
      pending: true,
    });
    const entries = await outbox.all();
    expect(entries.map((e) => [e.operation, e.label])).toEqual([
      ["squareRecord", "counts in square column 3, row 2"],
      ["squareDelete", "delete square record"],
    ]);
    expect(entries[0].localId).toBe(made.id);
    expect(entries[0].key).toMatch(/^[0-9a-f-]{36}$/);
    // Deleting the record made on this device drops its queued create instead of sending both.
    await write(buildRequest("squareDelete", { siteId, sampleId: made.id }));
    expect((await outbox.all()).map((e) => e.operation)).toEqual(["squareDelete"]);
  });

  it("sync sends the square records in the order entered, each once, the later one last", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(square(3, 12));
    await write(square(4, 0));
    await write(square(3, 14)); // the same square corrected: the server keeps the last
    const s = standInServer();
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 3, refused: 0, stopped: "done" });
    expect(s.seen.map((r) => [r.method, JSON.parse(r.body!).col, JSON.parse(r.body!).counts[0].count])).toEqual([
      ["POST", 3, 12],
      ["POST", 4, 0],
      ["POST", 3, 14],
    ]);
    expect(s.seen[0].url).toBe(`/api/sites/${siteId}/trenches/${trenchId}/squares`);
    expect(await outbox.all()).toHaveLength(0);
  });

  it("a square record refused on sync (a locked context) waits in needs attention with the reason", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(square(3, 12));
    const s = standInServer(() => new ApiError("Context 1005 is locked.", 409, {}, undefined, "locked"));
    expect(await syncOutbox({ outbox, send: s.send })).toMatchObject({ sent: 0, refused: 1 });
    const [entry] = await outbox.all();
    expect(entry.label).toBe("counts in square column 3, row 2");
    expect(entry.refusal).toMatchObject({ code: "locked", message: "Context 1005 is locked.", status: 409 });
  });
});

describe("sync", () => {
  it("sends in order, links a context made on the device to the server's id for the finds and relation that name it", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const ctx = (await write(buildRequest("contextsCreate", { siteId }, { trenchId, type: "deposit" } as never))) as {
      id: string;
      number: number;
    };
    expect(ctx.number).toBe(9001);
    await write(buildRequest("findsCreate", { siteId }, { contextId: ctx.id, classId, x: 1, y: 1, method: "plan" }));
    await write(
      buildRequest("relationsCreate", { siteId }, { contextId: ctx.id, reading: "above", otherId: contextId }),
    );
    const s = standInServer();
    const waiting: number[] = [];
    const out = await syncOutbox({ outbox, send: s.send, progress: (n) => waiting.push(n) });
    expect(out).toEqual({ sent: 3, refused: 0, stopped: "done" });
    expect(waiting).toEqual([2, 1, 0]);
    expect(s.seen.map((r) => r.operation)).toEqual(["contextsCreate", "findsCreate", "relationsCreate"]);
    const serverCtxId = (await s.send(s.seen[0])) as { id: string };
    expect(JSON.parse(s.seen[1].body!).contextId).toBe(serverCtxId.id);
    expect(JSON.parse(s.seen[2].body!).contextId).toBe(serverCtxId.id);
    expect(s.seen.some((r) => r.body?.includes(ctx.id))).toBe(false);
  });

  it("a replay of the same outbox creates nothing: the server answers each key with its first answer", async () => {
    const write = createWritePath({ outbox, online: () => false });
    for (let i = 0; i < 5; i++) await write(find(i));
    const copy = await outbox.all();
    const s = standInServer();
    await syncOutbox({ outbox, send: s.send });
    for (const e of copy) await outbox.put(e);
    const again = await syncOutbox({ outbox, send: s.send });
    expect(again.sent).toBe(5);
    expect(s.seen).toHaveLength(5);
  });

  it("a refusal moves that entry to needs attention with the server's reason; the rest still go", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(find(1));
    await write(find(2));
    await write(find(3));
    const s = standInServer((req) =>
      JSON.parse(req.body!).x === 2 ? new ApiError("Context 1005 is signed off.", 409, {}, {}, "locked") : null,
    );
    const out = await syncOutbox({ outbox, send: s.send });
    expect(out).toEqual({ sent: 2, refused: 1, stopped: "done" });
    const [left] = await outbox.all();
    expect(left).toMatchObject({
      state: "attention",
      label: "find #502",
      refusal: { code: "locked", status: 409, message: "Context 1005 is signed off." },
    });
  });

  it("a 401 pauses the sync and keeps everything waiting, never in needs attention", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(find(1));
    const out = await syncOutbox({
      outbox,
      send: async () => {
        throw new ApiError("Sign in first.", 401);
      },
    });
    expect(out.stopped).toBe("sign-in");
    expect(await outbox.count()).toEqual({ waiting: 1, attention: 0 });
  });

  it("no connection stops the sync with nothing lost; a busy server counts a try", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(find(1));
    expect(
      (
        await syncOutbox({
          outbox,
          send: async () => {
            throw new ApiError(NO_ANSWER, 0);
          },
        })
      ).stopped,
    ).toBe("offline");
    expect(
      (
        await syncOutbox({
          outbox,
          send: async () => {
            throw new ApiError("Busy", 503);
          },
        })
      ).stopped,
    ).toBe("server-busy");
    expect((await outbox.all())[0]).toMatchObject({ state: "waiting", attempts: 1 });
    expect([1, 2, 3, 9].map(backoffSeconds)).toEqual([2, 4, 8, 300]);
  });

  it("a damaged entry goes to needs attention instead of stopping the sync", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(find(1));
    await write(find(2));
    const [first] = await outbox.all();
    await outbox.put({ ...first, body: "{not json" });
    const s = standInServer();
    const out = await syncOutbox({ outbox, send: s.send });
    expect(out).toEqual({ sent: 1, refused: 1, stopped: "done" });
    expect((await outbox.all())[0]).toMatchObject({ state: "attention", refusal: { code: "damaged" } });
    expect(damaged({ key: "k", url: "/api/x", method: "POST" })).toMatch(/idempotency key/);
  });

  it("each user on a shared tablet has an outbox of their own", async () => {
    const other = await Outbox.open(`${userId}-other`);
    const write = createWritePath({ outbox, online: () => false });
    await write(find(1));
    expect(await other.all()).toHaveLength(0);
    await closeOutboxDb(`${userId}-other`);
  });
});

describe("the device's number blocks and what counts as no connection", () => {
  /** Blocks as the server lists them (lib/api/catalog/offline.ts numberBlockView). */
  const listed = (deviceId: string, id: string, first: number, last: number, free: number[]) => ({
    id,
    kind: "find" as const,
    first,
    last,
    size: last - first + 1,
    left: free.length,
    free,
    userId,
    deviceId,
    deviceLabel: "tablet",
    createdAt: "2026-07-14T09:30:00.000Z",
    releasedAt: null,
  });

  it("keeps this device's blocks with the numbers the server lists as free, never another tablet's", async () => {
    const answer = [listed("this-tablet", "b1", 501, 550, [503, 504]), listed("other-tablet", "b9", 601, 650, [601])];
    await refreshBlocks(outbox, siteId, async () => answer, "this-tablet");
    const blocks = await outbox.blocks();
    // b2 (a context block held before) is not listed any more: released or used up, so it is forgotten.
    expect(blocks.map((b) => b.id)).toEqual(["b1"]);
    const b1 = blocks.find((b) => b.id === "b1")!;
    expect(b1.used).toHaveLength(48);
    expect(b1.used).not.toContain(503);
    expect(freeNumbers(blocks, siteId, "find")).toBe(2);
  });

  it("a block the server no longer lists for this device is forgotten", async () => {
    await refreshBlocks(outbox, siteId, async () => [listed("other-tablet", "b1", 501, 550, [501])], "this-tablet");
    expect((await outbox.blocks()).some((b) => b.id === "b1")).toBe(false);
  });

  it("only a request that got no answer is a lost connection; a fault in our code is not", () => {
    expect(isNetworkFailure(new ApiError(NO_ANSWER, 0))).toBe(true);
    expect(isNetworkFailure(new DOMException("timed out", "TimeoutError"))).toBe(true);
    expect(isNetworkFailure(new TypeError("number 50 is not iterable"))).toBe(false);
    expect(isNetworkFailure(new ApiError("This change needs a connection to the server.", 0))).toBe(false);
    expect(isNetworkFailure(new ApiError("Refused.", 409))).toBe(false);
  });
});
