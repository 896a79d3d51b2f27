import "fake-indexeddb/auto";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { ApiError, NO_ANSWER, type UploadRequest } from "@/lib/api/client";
import { Outbox } from "./outbox";
import { closeOutboxDb } from "./outbox-db";
import { syncOutbox } from "./sync";
import { createUploadPath } from "./write-path";

const siteId = "5f0c6a52-8a7e-4a57-9d3e-0a2b1c3d4e5f";
const contextId = "0b7d1f7e-1c2a-4e0b-8f9a-6c5d4e3f2a1b";
let userN = 0;
let userId = "";
let outbox: Outbox;

beforeEach(async () => {
  userId = `photo-user-${++userN}`;
  outbox = await Outbox.open(userId);
});
afterEach(() => closeOutboxDb(userId));

const bytes = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3, 4, 5, 0xff, 0xd9]);
const photo = (name = "hearth.jpg") =>
  ({
    slug: "recordPhoto",
    file: new File([bytes], name, { type: "image/jpeg" }),
    input: { siteId, subject: "context", subjectId: contextId, facing: "NE", scale: "1 m", caption: "Hearth" },
    headers: { "idempotency-key": crypto.randomUUID() },
  }) satisfies UploadRequest;

/** An upload route stand-in: what reached it, one photo per idempotency key, numbers in order. */
function uploadServer(refuse: (req: UploadRequest) => ApiError | null = () => null) {
  const seen: { req: UploadRequest; bytes: Uint8Array }[] = [];
  const byKey = new Map<string, { photoId: string; number: number }>();
  return {
    seen,
    upload: async (req: UploadRequest) => {
      const key = req.headers["idempotency-key"]!;
      const again = byKey.get(key);
      if (again) return again;
      const refusal = refuse(req);
      if (refusal) throw refusal;
      seen.push({ req, bytes: new Uint8Array(await req.file.arrayBuffer()) });
      const answer = { photoId: crypto.randomUUID(), number: byKey.size + 1 };
      byKey.set(key, answer);
      return answer;
    },
  };
}

describe("photos taken on a device with no connection", () => {
  it("are kept in the outbox with the file itself, then uploaded with the same key when the connection returns", async () => {
    let online = false;
    const server = uploadServer();
    const path = createUploadPath({ outbox, online: () => online, send: server.upload });
    const req = photo();
    const answer = await path(req);
    expect(answer).toEqual({ photoId: "", number: null, pending: true });
    expect(server.seen).toHaveLength(0);

    // Reopened from IndexedDB, as after the tab was closed: the Blob and the sheet are there.
    await closeOutboxDb(userId);
    outbox = await Outbox.open(userId);
    const [kept] = await outbox.all();
    expect(kept!.label).toBe("photo “hearth.jpg” of a context");
    expect(kept!.key).toBe(req.headers["idempotency-key"]);
    expect(kept!.file).toBeInstanceOf(Blob);
    expect(new Uint8Array(await kept!.file!.arrayBuffer())).toEqual(bytes);

    online = true;
    const out = await syncOutbox({ outbox, upload: server.upload, send: () => Promise.reject(new Error("no JSON")) });
    expect(out).toEqual({ sent: 1, refused: 0, stopped: "done" });
    expect(server.seen).toHaveLength(1);
    const sent = server.seen[0]!;
    expect(sent.req.file.name).toBe("hearth.jpg");
    expect(sent.req.file.type).toBe("image/jpeg");
    expect(sent.bytes).toEqual(bytes);
    expect(sent.req.input).toEqual(req.input);
    expect(sent.req.headers["idempotency-key"]).toBe(req.headers["idempotency-key"]);
    expect(await outbox.all()).toEqual([]);
  });

  it("a connection lost on the way keeps the photo with its key; a replay records it once", async () => {
    const server = uploadServer();
    let drop = true;
    const path = createUploadPath({
      outbox,
      online: () => true,
      send: async (req) => {
        const answer = await server.upload(req);
        // The server recorded it, but the answer never came back.
        if (drop) throw new ApiError(NO_ANSWER, 0);
        return answer;
      },
    });
    const answer = await path(photo());
    expect(answer.pending).toBe(true);
    expect(await outbox.count()).toEqual({ waiting: 1, attention: 0 });
    drop = false;
    await syncOutbox({ outbox, upload: server.upload });
    expect(server.seen).toHaveLength(1);
    expect(await outbox.count()).toEqual({ waiting: 0, attention: 0 });
  });

  it("online with nothing waiting, a photo goes straight up; a refusal is the caller's to show, nothing is kept", async () => {
    const server = uploadServer((req) =>
      req.file.name === "late.jpg" ? new ApiError("Context 1003 was signed off.", 409, {}, undefined, "locked") : null,
    );
    const path = createUploadPath({ outbox, online: () => true, send: server.upload });
    await expect(path(photo())).resolves.toMatchObject({ number: 1 });
    await expect(path(photo("late.jpg"))).rejects.toMatchObject({ status: 409, code: "locked" });
    expect(await outbox.all()).toEqual([]);
  });

  it("a photo refused when it reaches the server waits for the user with the server's reason; the rest go on", async () => {
    const server = uploadServer((req) =>
      req.file.name === "late.jpg" ? new ApiError("Context 1003 was signed off.", 409, {}, undefined, "locked") : null,
    );
    const path = createUploadPath({ outbox, online: () => false, send: server.upload });
    await path(photo("late.jpg"));
    await path(photo("section.jpg"));
    const out = await syncOutbox({ outbox, upload: server.upload });
    expect(out).toEqual({ sent: 1, refused: 1, stopped: "done" });
    const [left] = await outbox.all();
    expect(left!.state).toBe("attention");
    expect(left!.refusal).toMatchObject({ code: "locked", status: 409, message: "Context 1003 was signed off." });
    expect(server.seen.map((s) => s.req.file.name)).toEqual(["section.jpg"]);
  });
});
