import "fake-indexeddb/auto";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { buildRequest, type ApiRequest } from "@/lib/api/client";
import { Outbox } from "./outbox";
import { closeOutboxDb } from "./outbox-db";
import { syncOutbox } from "./sync";
import { createWritePath, worksOffline } from "./write-path";

/** Spits and levelling runs recorded on a device with no connection, then sent: like finds, in order. */
const siteId = "5f0c6a52-8a7e-4a57-9d3e-0a2b1c3d4e5f";
const classId = "9c1d2e3f-4a5b-4c6d-8e7f-0a1b2c3d4e5f";
const trenchId = "1a2b3c4d-5e6f-4a7b-8c9d-0e1f2a3b4c5d";
const benchmarkId = "2b3c4d5e-6f7a-4b8c-9d0e-1f2a3b4c5d6e";
const serverSpitId = "3c4d5e6f-7a8b-4c9d-8e0f-1a2b3c4d5e6f";
const serverContextId = "0b7d1f7e-1c2a-4e0b-8f9a-6c5d4e3f2a1b";
let userN = 0;
let userId = "";
let outbox: Outbox;

beforeEach(async () => {
  userId = `levels-${++userN}`;
  outbox = await Outbox.open(userId);
  await outbox.putBlock({ id: "b1", siteId, kind: "find", first: 501, last: 550, used: [] });
  await outbox.putBlock({ id: "b2", siteId, kind: "context", first: 9001, last: 9010, used: [] });
});
afterEach(() => closeOutboxDb(userId));

/** A server stand-in: records what reached it and gives each created record an id. */
function server() {
  const seen: ApiRequest[] = [];
  const byKey = new Map<string, unknown>();
  return {
    seen,
    send: async (req: ApiRequest) => {
      const key = req.headers["idempotency-key"];
      if (byKey.has(key)) return byKey.get(key);
      seen.push(req);
      const answer = { id: crypto.randomUUID(), ...(req.body ? JSON.parse(req.body) : {}) };
      byKey.set(key, answer);
      return answer;
    },
  };
}

/** A day's levels on a device with no connection: a new context, its first spit, a find in it, the levelling. */
async function recordOffline() {
  const write = createWritePath({ outbox, online: () => false });
  const ctx = (await write(buildRequest("contextsCreate", { siteId }, { trenchId, type: "layer" } as never))) as {
    id: string;
  };
  const spit = (await write(buildRequest("spitsCreate", { siteId, contextId: ctx.id }, { number: 1 }))) as {
    id: string;
    contextId: string;
    number: number;
    pending: boolean;
  };
  const changed = (await write(
    buildRequest("spitUpdate", { siteId, contextId: ctx.id, spitId: spit.id }, { topLevel: 49.32, baseLevel: 49.22 }),
  )) as { number: number; topLevel: number };
  const find = (await write(
    buildRequest("findsCreate", { siteId }, {
      contextId: ctx.id,
      classId,
      spitId: spit.id,
      x: 1,
      y: 1,
      method: "plan",
    } as never),
  )) as { id: string; number: number };
  const run = (await write(
    buildRequest("levelRunsCreate", { siteId }, {
      takenOn: "2026-07-14",
      startBenchmarkId: benchmarkId,
      lines: [
        { station: "TBM 1", target: "benchmark", targetId: benchmarkId, backsight: 1.412 },
        { station: "spit 1 top", target: "spit_top", targetId: spit.id, foresight: 1.655 },
      ],
    } as never),
  )) as { id: string; pending: boolean };
  return { ctx, spit, changed, find, run };
}

describe("spits and levelling runs on a device with no connection", () => {
  it("are queued like finds, each with its own key, taking no number from the device's blocks", async () => {
    const { ctx, spit, changed, find, run } = await recordOffline();
    expect(spit).toMatchObject({ contextId: ctx.id, number: 1, pending: true });
    expect(changed).toMatchObject({ number: 1, topLevel: 49.32, pending: true });
    expect(find.number).toBe(501);
    expect(run.pending).toBe(true);
    const entries = await outbox.all();
    // The spit's change went into its queued create rather than waiting behind it as a second write.
    expect(entries.map((e) => e.label)).toEqual(["context 9001", "spit 1", "find #501", "levelling run"]);
    expect(JSON.parse(entries[1]!.body!)).toEqual({ number: 1, topLevel: 49.32, baseLevel: 49.22 });
    expect(new Set(entries.map((e) => e.key)).size).toBe(4);
    const blocks = await outbox.blocks();
    expect(blocks.find((b) => b.kind === "find")!.used).toEqual([501]);
    expect(blocks.find((b) => b.kind === "context")!.used).toEqual([9001]);
    expect(worksOffline("spitsCreate") && worksOffline("spitUpdate") && worksOffline("levelRunsCreate")).toBe(true);
  });

  it("are sent in order, the spit under the context's new id and the run naming the spit's", async () => {
    const { ctx, spit } = await recordOffline();
    const s = server();
    const out = await syncOutbox({ outbox, send: s.send });
    expect(out).toEqual({ sent: 4, refused: 0, stopped: "done" });
    expect(s.seen.map((r) => r.operation)).toEqual(["contextsCreate", "spitsCreate", "findsCreate", "levelRunsCreate"]);
    const [ctxOnServer, spitOnServer] = [
      (await s.send(s.seen[0]!)) as { id: string },
      (await s.send(s.seen[1]!)) as { id: string },
    ];
    expect(s.seen[1]!.url).toBe(`/api/sites/${siteId}/contexts/${ctxOnServer.id}/spits`);
    expect(JSON.parse(s.seen[2]!.body!).spitId).toBe(spitOnServer.id);
    expect(JSON.parse(s.seen[3]!.body!).lines[1].targetId).toBe(spitOnServer.id);
    expect(s.seen.some((r) => r.url.includes(ctx.id) || r.body?.includes(spit.id))).toBe(false);
  });

  it("a change to a spit already on the server waits in the outbox with what was changed", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(
      buildRequest("spitUpdate", { siteId, contextId: serverContextId, spitId: serverSpitId }, { baseLevel: 49.18 }),
    );
    const [entry] = await outbox.all();
    expect(entry).toMatchObject({ operation: "spitUpdate", method: "PATCH", label: "change spit" });
    expect(entry!.url).toBe(`/api/sites/${siteId}/contexts/${serverContextId}/spits/${serverSpitId}`);
    expect(JSON.parse(entry!.body!)).toEqual({ baseLevel: 49.18 });
  });
});
