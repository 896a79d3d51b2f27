import "fake-indexeddb/auto";
import { describe, expect, it } from "vitest";
import { ApiError, buildRequest } from "@/lib/api/client";
import type { Outbox } from "./outbox";
import { queuedBoxes } from "./queued";
import { syncOutbox } from "./sync";
import { outboxPerTest, siteId, standInServer } from "./test-device";
import { createWritePath, worksOffline } from "./write-path";

/** The box register on a device with no connection: boxes deleted (and added) in the finds shed. */
const boxId = "4d5e6f7a-8b9c-4d0e-9f1a-2b3c4d5e6f7a";
let outbox: Outbox;
outboxPerTest("boxes", [], (o) => (outbox = o));

describe("deleting a box on a device with no connection", () => {
  it("waits in the outbox with a key and a label, and the screen hears it is pending", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const answer = await write(buildRequest("boxDelete", { siteId, boxId }));
    expect(answer).toEqual({ deleted: boxId, pending: true });
    const [entry] = await outbox.all();
    expect(entry).toMatchObject({ operation: "boxDelete", method: "DELETE", label: "delete box", siteId });
    expect(entry!.key).toMatch(/^[0-9a-f-]{36}$/);
    expect(worksOffline("boxDelete")).toBe(true);
  });

  it("a box filled meanwhile is refused on arrival and waits in needs attention with the server's words", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(buildRequest("boxDelete", { siteId, boxId }));
    const words =
      "Box 4 still holds 2 finds; only an empty box can be deleted. Move them to another box first, then delete the box.";
    const s = standInServer(() => new ApiError(words, 409, {}, { finds: 2, samples: 0 }, "conflict"));
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 0, refused: 1, stopped: "done" });
    const [held] = await outbox.all();
    expect(held).toMatchObject({ state: "attention", refusal: { status: 409, message: words, code: "conflict" } });
  });
});

describe("adding a box on a device with no connection", () => {
  const findIds = ["6e7f8a9b-0c1d-4e2f-8a3b-4c5d6e7f8a9b"];

  it("waits in the outbox and takes the next number when it reaches the server", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const made = (await write(buildRequest("boxesCreate", { siteId }, { store: "Finds shed, shelf 2" }))) as {
      id: string;
    };
    expect(made).toEqual({ id: made.id, number: null, store: "Finds shed, shelf 2", note: "", pending: true });
    const [entry] = await outbox.all();
    expect(entry).toMatchObject({ operation: "boxesCreate", label: "new box", localId: made.id });
    expect(JSON.parse(entry!.body!)).toEqual({ store: "Finds shed, shelf 2" });
    expect(worksOffline("boxesCreate") && worksOffline("boxUpdate")).toBe(true);
    const s = standInServer();
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 1, refused: 0, stopped: "done" });
    expect(s.seen.map((r) => [r.operation, r.url])).toEqual([["boxesCreate", `/api/sites/${siteId}/boxes`]]);
    expect(await outbox.serverIdOf(made.id)).toBeTruthy();
  });

  it("finds boxed in it on the device wait for it, then go under the box's server id", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const made = (await write(buildRequest("boxesCreate", { siteId }, { number: 12 } as never))) as { id: string };
    expect(made).toMatchObject({ number: 12, pending: true });
    await write(
      buildRequest("findsBulk", { siteId }, { action: "process", findIds, processing: "boxed", boxId: made.id }),
    );
    expect((await outbox.all()).map((e) => e.label)).toEqual(["box 12", "process 1 find"]);
    const s = standInServer();
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 2, refused: 0, stopped: "done" });
    const serverId = await outbox.serverIdOf(made.id);
    expect(JSON.parse(s.seen[1]!.body!).boxId).toBe(serverId);
  });

  it("changed or deleted before it is sent, the queued box is changed or dropped: nothing reaches the server twice", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const made = (await write(buildRequest("boxesCreate", { siteId }, { store: "Shed" }))) as { id: string };
    await write(buildRequest("boxUpdate", { siteId, boxId: made.id }, { note: "pottery only" }));
    expect((await outbox.all()).map((e) => JSON.parse(e.body!))).toEqual([{ store: "Shed", note: "pottery only" }]);
    expect(await write(buildRequest("boxDelete", { siteId, boxId: made.id }))).toMatchObject({
      deleted: made.id,
      pending: true,
    });
    expect(await outbox.all()).toEqual([]);
  });

  it("a number taken meanwhile is refused on arrival and waits in needs attention; finds boxed in it wait too", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const made = (await write(buildRequest("boxesCreate", { siteId }, { number: 3 } as never))) as { id: string };
    await write(
      buildRequest("findsBulk", { siteId }, { action: "process", findIds, processing: "boxed", boxId: made.id }),
    );
    const s = standInServer((req) =>
      req.operation === "boxesCreate"
        ? new ApiError("Box 3 is already in the register.", 409, { number: ["Box 3 exists."] }, undefined, "duplicate")
        : null,
    );
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 0, refused: 1, stopped: "done" });
    const [held, waiting] = await outbox.all();
    expect(held).toMatchObject({ label: "box 3", state: "attention", refusal: { code: "duplicate" } });
    expect(waiting).toMatchObject({ label: "process 1 find" });
    expect(waiting!.state).not.toBe("attention");
    expect(s.seen.map((r) => r.operation)).toEqual(["boxesCreate"]);
  });

  it("online with nothing waiting, a new box is sent at once with an idempotency key", async () => {
    const s = standInServer();
    const write = createWritePath({ outbox, online: () => true, send: s.send });
    await write(buildRequest("boxesCreate", { siteId }, { store: "Shed" }));
    expect(s.seen[0]!.headers["idempotency-key"]).toMatch(/^[0-9a-f-]{36}$/);
    expect((await outbox.count()).waiting).toBe(0);
  });
});

describe("emptying a box into another on a device with no connection", () => {
  const intoBoxId = "8f9e0d1c-2b3a-4c5d-9e6f-7a8b9c0d1e2f";

  it("waits in the outbox with a key and a label; sent in order when the connection is back", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const answer = await write(buildRequest("boxEmpty", { siteId, boxId }, { intoBoxId }));
    expect(answer).toEqual({ label: "empty a box into another", pending: true });
    const [entry] = await outbox.all();
    expect(entry).toMatchObject({ operation: "boxEmpty", method: "POST", label: "empty a box into another", siteId });
    expect(entry!.key).toMatch(/^[0-9a-f-]{36}$/);
    expect(worksOffline("boxEmpty")).toBe(true);
    const s = standInServer();
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 1, refused: 0, stopped: "done" });
    expect(s.seen.map((r) => [r.url, JSON.parse(r.body!)])).toEqual([
      [`/api/sites/${siteId}/boxes/${boxId}/empty`, { intoBoxId }],
    ]);
    expect(s.seen[0]!.headers["idempotency-key"]).toBe(entry!.key);
  });

  it("into a box added on the device, it waits for that box and goes under the box's server id", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const made = (await write(buildRequest("boxesCreate", { siteId }, { number: 20 } as never))) as { id: string };
    await write(buildRequest("boxEmpty", { siteId, boxId }, { intoBoxId: made.id }));
    const s = standInServer();
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 2, refused: 0, stopped: "done" });
    expect(JSON.parse(s.seen[1]!.body!).intoBoxId).toBe(await outbox.serverIdOf(made.id));
  });

  it("the other box deleted meanwhile: refused on arrival, kept in needs attention with the server's words", async () => {
    const write = createWritePath({ outbox, online: () => false });
    await write(buildRequest("boxEmpty", { siteId, boxId }, { intoBoxId }));
    const words = "The box to empty it into is not one of this site's boxes: it may have been deleted.";
    const s = standInServer(() => new ApiError(words, 400, { intoBoxId: ["Unknown box."] }));
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 0, refused: 1, stopped: "done" });
    const [held] = await outbox.all();
    expect(held).toMatchObject({ state: "attention", refusal: { status: 400, message: words } });
  });
});

describe("the box register on a device with boxes not yet sent", () => {
  it("lists the site's queued boxes, marked waiting, with changes made before sending, until they sync", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const blank = (await write(buildRequest("boxesCreate", { siteId }, { store: "Shed" }))) as { id: string };
    const numbered = (await write(buildRequest("boxesCreate", { siteId }, { number: 7 } as never))) as { id: string };
    await write(buildRequest("boxUpdate", { siteId, boxId: numbered.id }, { note: "bone only" }));
    const otherSite = "7a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c4d";
    await write(buildRequest("boxesCreate", { siteId: otherSite }, { store: "Elsewhere" }));
    await write(buildRequest("boxDelete", { siteId, boxId }));
    expect(queuedBoxes(await outbox.all(), siteId)).toEqual([
      { id: blank.id, number: null, store: "Shed", note: "", state: "waiting" },
      { id: numbered.id, number: 7, store: "", note: "bone only", state: "waiting" },
    ]);
    const s = standInServer();
    await syncOutbox({ outbox, send: s.send });
    expect(queuedBoxes(await outbox.all(), siteId)).toEqual([]);
  });

  it("a queued box the server refused stays listed, marked as needing attention", async () => {
    const write = createWritePath({ outbox, online: () => false });
    const made = (await write(buildRequest("boxesCreate", { siteId }, { number: 3 } as never))) as { id: string };
    const s = standInServer(() => new ApiError("Box 3 is already in the register.", 409, {}, undefined, "duplicate"));
    await syncOutbox({ outbox, send: s.send });
    expect(queuedBoxes(await outbox.all(), siteId)).toEqual([
      { id: made.id, number: 3, store: "", note: "", state: "attention" },
    ]);
  });
});
