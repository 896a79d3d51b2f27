import "fake-indexeddb/auto";
import { describe, expect, it } from "vitest";
import { buildRequest } from "@/lib/api/client";
import { Outbox } from "./outbox";
import { syncOutbox } from "./sync";
import { createWritePath, worksOffline } from "./write-path";
import { HELD_BLOCKS, classId, contextId, outboxPerTest, siteId, standInServer, trenchId } from "./test-device";

/** Spits and levelling runs recorded on a device with no connection, then sent: like finds, in order. */
const benchmarkId = "2b3c4d5e-6f7a-4b8c-9d0e-1f2a3b4c5d6e";
const serverSpitId = "3c4d5e6f-7a8b-4c9d-8e0f-1a2b3c4d5e6f";
let outbox: Outbox;
outboxPerTest("levels", HELD_BLOCKS, (o) => (outbox = o));

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
    const s = standInServer();
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
    await write(buildRequest("spitUpdate", { siteId, contextId, spitId: serverSpitId }, { baseLevel: 49.18 }));
    const [entry] = await outbox.all();
    expect(entry).toMatchObject({ operation: "spitUpdate", method: "PATCH", label: "change spit" });
    expect(entry!.url).toBe(`/api/sites/${siteId}/contexts/${contextId}/spits/${serverSpitId}`);
    expect(JSON.parse(entry!.body!)).toEqual({ baseLevel: 49.18 });
  });
});
