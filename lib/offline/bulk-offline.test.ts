import "fake-indexeddb/auto";
import { describe, expect, it } from "vitest";
import { ApiError, buildRequest } from "@/lib/api/client";
import type { Outbox } from "./outbox";
import { syncOutbox } from "./sync";
import { classId, contextId, outboxPerTest, siteId, standInServer } from "./test-device";
import { createWritePath, worksOffline } from "./write-path";

/**
 * Changes to many finds or samples at once (the register's bulk bar, the finds shed) on a device with no connection.
 */
const boxId = "4d5e6f7a-8b9c-4d0e-9f1a-2b3c4d5e6f7a";
const onServer = ["6e7f8a9b-0c1d-4e2f-8a3b-4c5d6e7f8a9b", "7f8a9b0c-1d2e-4f3a-9b4c-5d6e7f8a9b0c"];
let outbox: Outbox;
outboxPerTest("bulk", [{ id: "b1", siteId, kind: "find", first: 701, last: 750, used: [] }], (o) => (outbox = o));

describe("bulk changes on a device with no connection", () => {
  it("wait in the outbox with a key and a label, and the screen hears they are pending", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const moved = await write(
      buildRequest("findsBulk", { siteId }, { action: "move", findIds: onServer, contextId } as never),
    );
    const boxed = await write(
      buildRequest("findsBulk", { siteId }, {
        action: "process",
        findIds: onServer,
        processing: "boxed",
        boxId,
      } as never),
    );
    const stored = await write(buildRequest("samplesStore", { siteId }, { sampleIds: [onServer[0]!], boxId } as never));
    expect(moved).toMatchObject({ action: "move", pending: true });
    expect(boxed).toMatchObject({ action: "process", pending: true });
    expect(stored).toMatchObject({ pending: true });
    const entries = await outbox.all();
    expect(entries.map((e) => e.label)).toEqual(["move 2 finds", "process 2 finds", "store 1 sample"]);
    expect(new Set(entries.map((e) => e.key)).size).toBe(3);
    expect(JSON.parse(entries[1]!.body!)).toEqual({ action: "process", findIds: onServer, processing: "boxed", boxId });
    expect(worksOffline("findsBulk") && worksOffline("samplesStore") && worksOffline("samplesStatus")).toBe(true);
  });

  it("a change naming a find recorded on the device waits for it, then goes under the find's server id", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const made = (await write(
      buildRequest("findsCreate", { siteId }, { contextId, classId, x: 1, y: 1, method: "plan" } as never),
    )) as { id: string };
    await write(
      buildRequest("findsBulk", { siteId }, {
        action: "process",
        findIds: [made.id, onServer[0]],
        processing: "washed",
      } as never),
    );
    const s = standInServer();
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 2, refused: 0, stopped: "done" });
    expect(s.seen.map((r) => r.operation)).toEqual(["findsCreate", "findsBulk"]);
    const serverId = await outbox.serverIdOf(made.id);
    expect(serverId).toBeTruthy();
    expect(JSON.parse(s.seen[1]!.body!).findIds).toEqual([serverId, onServer[0]]);
  });

  it("a refusal on arrival waits in needs attention with the server's words naming the find; the rest go on", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(buildRequest("findsBulk", { siteId }, { action: "move", findIds: onServer, contextId } as never));
    await write(
      buildRequest("findsBulk", { siteId }, { action: "process", findIds: onServer, processing: "washed" } as never),
    );
    const words = "No find was moved: 1 find stops it. find 12: Context 8801 was signed off by Director";
    const s = standInServer((req) =>
      JSON.parse(req.body!).action === "move" ? new ApiError(words, 409, {}, undefined, "conflict") : null,
    );
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 1, refused: 1, stopped: "done" });
    const [held] = await outbox.all();
    expect(held).toMatchObject({ label: "move 2 finds", state: "attention" });
    expect(held!.refusal).toMatchObject({ status: 409, message: words });
  });

  it("online with nothing waiting, a bulk change is sent at once with an idempotency key", async () => {
    const s = standInServer();
    const write = createWritePath({ outbox, online: () => true, send: s.send });
    await write(buildRequest("findsBulk", { siteId }, { action: "reclass", findIds: onServer, classId } as never));
    expect(s.seen).toHaveLength(1);
    expect(s.seen[0]!.headers["idempotency-key"]).toMatch(/^[0-9a-f-]{36}$/);
    expect((await outbox.count()).waiting).toBe(0);
  });
});
