import "fake-indexeddb/auto";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { ApiError, buildRequest, type ApiRequest } from "@/lib/api/client";
import { Outbox } from "./outbox";
import { closeOutboxDb } from "./outbox-db";
import { syncOutbox } from "./sync";
import { createWritePath, worksOffline } from "./write-path";

/** The box register on a device with no connection: boxes deleted (and added) in the finds shed. */
const siteId = "5f0c6a52-8a7e-4a57-9d3e-0a2b1c3d4e5f";
const boxId = "4d5e6f7a-8b9c-4d0e-9f1a-2b3c4d5e6f7a";
let userN = 0;
let userId = "";
let outbox: Outbox;

beforeEach(async () => {
  userId = `boxes-${++userN}`;
  outbox = await Outbox.open(userId);
});
afterEach(() => closeOutboxDb(userId));

/** A server stand-in: records what reached it, refuses what `refuse` says. */
function server(refuse?: (req: ApiRequest) => ApiError | null) {
  const seen: ApiRequest[] = [];
  return {
    seen,
    send: async (req: ApiRequest) => {
      seen.push(req);
      const no = refuse?.(req);
      if (no) throw no;
      return req.method === "DELETE" ? { deleted: boxId, number: 4 } : { id: crypto.randomUUID() };
    },
  };
}

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
    const s = server(() => new ApiError(words, 409, {}, { finds: 2, samples: 0 }, "conflict"));
    expect(await syncOutbox({ outbox, send: s.send })).toEqual({ sent: 0, refused: 1, stopped: "done" });
    const [held] = await outbox.all();
    expect(held).toMatchObject({ state: "attention", refusal: { status: 409, message: words, code: "conflict" } });
  });
});
