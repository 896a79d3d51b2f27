/**
 * The upload fake against the real uploadthing SDK (v7.7): UTApi for server-side uploads and file
 * management, and the Next route handler (createRouteHandler) for the browser flow, in both the
 * production flow (callback POSTed to the app) and the development flow (callback streamed back).
 * The browser half (HEAD then PUT with Range) is replayed with fetch the way uploadthing/client does it.
 */
import http from "node:http";
import os from "node:os";
import path from "node:path";
import { mkdtemp, rm } from "node:fs/promises";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createRouteHandler, createUploadthing, type FileRouter } from "uploadthing/next";
import { UTApi, UTFile } from "uploadthing/server";
import { FAKE_UPLOADTHING_TOKEN, startUploadFake, type UploadFake } from "./upload-fake";
import { parseToken } from "./upload-fake-signing";

let dir: string;
let fake: UploadFake;
/** What only the app's server holds. */
const serverKey = { "x-uploadthing-api-key": parseToken(FAKE_UPLOADTHING_TOKEN).apiKey };
const completed: { metadata: unknown; name: string; size: number; ufsUrl: string }[] = [];

const f = createUploadthing();
const router = {
  photo: f({ image: { maxFileSize: "1MB", maxFileCount: 1 } })
    .middleware(() => ({ who: "tester" }))
    .onUploadComplete(({ metadata, file }) => {
      completed.push({ metadata, name: file.name, size: file.size, ufsUrl: file.ufsUrl });
      return { stored: file.name };
    }),
  quick: f({ image: { maxFileSize: "1MB" } }, { presignedURLTTL: "1s" }).onUploadComplete(() => ({ ok: true })),
} satisfies FileRouter;

/** Serves a web Request handler over node http, as Next would. */
async function serveApp(handler: (req: Request) => Promise<Response>) {
  const server = http.createServer(async (req, res) => {
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const body = chunks.length ? Buffer.concat(chunks) : undefined;
    const request = new Request(`http://${req.headers.host}${req.url}`, {
      method: req.method,
      headers: req.headers as Record<string, string>,
      body,
    });
    const out = await handler(request);
    res.writeHead(out.status, Object.fromEntries(out.headers.entries()));
    res.end(Buffer.from(await out.arrayBuffer()));
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", () => r()));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return { url, close: () => new Promise<void>((r) => server.close(() => r())) };
}

function pngBytes(n: number): Uint8Array<ArrayBuffer> {
  const b = new Uint8Array(new ArrayBuffer(n));
  b.set([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  for (let i = 8; i < n; i++) b[i] = (i * 31) % 251;
  return b;
}

/** What uploadthing/client does for one file: ask the app for a presigned URL, HEAD it, PUT the rest. */
async function browserUpload(appUrl: string, slug: string, bytes: Uint8Array<ArrayBuffer>, name = "trench.png") {
  const res = await fetch(`${appUrl}/api/uploadthing?actionType=upload&slug=${slug}`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-uploadthing-package": "test" },
    body: JSON.stringify({ files: [{ name, size: bytes.length, type: "image/png", lastModified: 1 }], input: null }),
  });
  expect(res.status, await res.clone().text()).toBe(200);
  const [presigned] = (await res.json()) as { url: string; key: string }[];
  return { presigned, put: () => putFrom(presigned.url, bytes, name) };
}

async function putFrom(url: string, bytes: Uint8Array<ArrayBuffer>, name: string, start?: number) {
  const head = await fetch(url, { method: "HEAD" });
  const from = start ?? Number(head.headers.get("x-ut-range-start") ?? "0");
  const form = new FormData();
  form.append("file", new Blob([bytes.slice(from)], { type: "image/png" }), name);
  const put = await fetch(url, { method: "PUT", body: form, headers: { Range: `bytes=${from}-` } });
  return { status: put.status, json: (await put.json()) as Record<string, any> };
}

beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), "upload-fake-"));
  fake = await startUploadFake({ port: 0, dir, metadataWaitMs: 3000, callbackTimeoutMs: 5000 });
});
afterAll(async () => {
  await fake?.stop();
  await rm(dir, { recursive: true, force: true });
});

describe("UTApi against the fake", () => {
  it("uploads, lists, serves and deletes a file", async () => {
    const utapi = new UTApi({
      token: FAKE_UPLOADTHING_TOKEN,
      ingestUrl: fake.url,
      apiUrl: fake.url,
      ...fake.ufs,
      logLevel: "Error",
    });
    const bytes = pngBytes(5000);
    const up = await utapi.uploadFiles(new UTFile([bytes], "peg-plan.png"));
    expect(up.error).toBeNull();
    expect(up.data!.size).toBe(5000);
    const served = await fetch((await utapi.generateSignedURL(up.data!.key)).ufsUrl);
    expect(served.headers.get("content-type")).toBe("image/png");
    expect(new Uint8Array(await served.arrayBuffer())).toEqual(bytes);
    const listed = await utapi.listFiles();
    expect(listed.files.map((x) => x.key)).toContain(up.data!.key);
    expect(await utapi.deleteFiles(up.data!.key)).toEqual({ success: true, deletedCount: 1 });
    expect((await fetch(up.data!.ufsUrl, { headers: serverKey })).status).toBe(404);
  });

  it("keeps files private: served on a URL signed with the api key or to the key itself, refused to anyone else", async () => {
    const utapi = new UTApi({
      token: FAKE_UPLOADTHING_TOKEN,
      ingestUrl: fake.url,
      apiUrl: fake.url,
      ...fake.ufs,
      logLevel: "Error",
    });
    const up = await utapi.uploadFiles(new UTFile([pngBytes(3000)], "context-sheet.png"));
    const key = up.data!.key;
    // Signed out, with the key the upload reported: no.
    expect((await fetch(up.data!.ufsUrl)).status).toBe(403);
    expect((await fetch(`${fake.url}/a/loamwork-local/${encodeURIComponent(key)}`)).status).toBe(403);
    expect((await fetch(up.data!.ufsUrl, { method: "HEAD" })).status).toBe(403);
    expect((await fetch(up.data!.ufsUrl, { headers: { "x-uploadthing-api-key": "sk_guessed" } })).status).toBe(403);
    // The app's own credentials: yes.
    expect((await fetch(up.data!.ufsUrl, { headers: serverKey })).status).toBe(200);
    const signed = (await utapi.generateSignedURL(key, { expiresIn: 60 })).ufsUrl;
    expect((await fetch(signed)).status).toBe(200);
    // A signed URL bent to another file, or out of date, is refused.
    const other = (await utapi.uploadFiles(new UTFile([pngBytes(2000)], "other.png"))).data!.key;
    expect((await fetch(signed.replace(encodeURIComponent(key), encodeURIComponent(other)))).status).toBe(403);
    const stale = new UTApi({ token: FAKE_UPLOADTHING_TOKEN, ...fake.ufs, logLevel: "Error" });
    const shortLived = (await stale.generateSignedURL(key, { expiresIn: 1 })).ufsUrl;
    await new Promise((r) => setTimeout(r, 1100));
    expect((await fetch(shortLived)).status).toBe(403);
  });

  it("refuses management calls without the api key", async () => {
    const res = await fetch(`${fake.url}/v6/listFiles`, { method: "POST", body: "{}" });
    expect(res.status).toBe(401);
  });
});

for (const isDev of [false, true]) {
  describe(`route handler, ${isDev ? "development" : "production"} flow`, () => {
    let app: Awaited<ReturnType<typeof serveApp>>;
    beforeAll(async () => {
      const handlers = createRouteHandler({
        router,
        config: {
          token: FAKE_UPLOADTHING_TOKEN,
          ingestUrl: fake.url,
          isDev,
          logLevel: "Error",
          handleDaemonPromise: isDev ? "void" : "await",
        },
      });
      app = await serveApp((req) => (req.method === "POST" ? handlers.POST(req as never) : handlers.GET(req as never)));
    });
    afterAll(() => app.close());

    it("runs onUploadComplete with the middleware's metadata and returns its server data to the uploader", async () => {
      const before = completed.length;
      const bytes = pngBytes(20_000);
      const { presigned, put } = await browserUpload(app.url, "photo", bytes);
      const out = await put();
      expect(out.status).toBe(200);
      expect(out.json.error).toBeUndefined();
      expect(out.json.serverData).toEqual({ stored: "trench.png" });
      expect(completed.length).toBe(before + 1);
      expect(completed.at(-1)).toMatchObject({ metadata: { who: "tester" }, name: "trench.png", size: 20_000 });
      const served = await fetch(completed.at(-1)!.ufsUrl, { headers: serverKey });
      expect(new Uint8Array(await served.arrayBuffer())).toEqual(bytes);
      expect(out.json.key ?? presigned.key).toBe(presigned.key);
    });

    it("handles several uploads at once", async () => {
      const runs = await Promise.all(
        [1, 2, 3].map(async (i) => (await browserUpload(app.url, "photo", pngBytes(1000 * i), `p${i}.png`)).put()),
      );
      expect(runs.map((r) => r.json.serverData)).toEqual([
        { stored: "p1.png" },
        { stored: "p2.png" },
        { stored: "p3.png" },
      ]);
    });
  });
}

describe("presigned URL checks and resumable PUT", () => {
  let app: Awaited<ReturnType<typeof serveApp>>;
  beforeAll(async () => {
    const handlers = createRouteHandler({
      router,
      config: { token: FAKE_UPLOADTHING_TOKEN, ingestUrl: fake.url, isDev: false, logLevel: "Error" },
    });
    app = await serveApp((req) => (req.method === "POST" ? handlers.POST(req as never) : handlers.GET(req as never)));
  });
  afterAll(() => app.close());

  it("refuses a tampered URL with 403 on HEAD and PUT", async () => {
    const { presigned } = await browserUpload(app.url, "photo", pngBytes(3000));
    const tampered = presigned.url.replace("x-ut-file-size=3000", "x-ut-file-size=999999");
    expect(tampered).not.toBe(presigned.url);
    expect((await fetch(tampered, { method: "HEAD" })).status).toBe(403);
    const out = await putFrom(tampered, pngBytes(3000), "x.png", 0);
    expect(out.status).toBe(403);
    expect(out.json.error).toMatch(/signature/);
  });

  it("refuses an expired URL", async () => {
    const { presigned } = await browserUpload(app.url, "quick", pngBytes(100));
    await new Promise((r) => setTimeout(r, 1100));
    const out = await putFrom(presigned.url, pngBytes(100), "x.png", 0);
    expect(out.status).toBe(403);
    expect(out.json.error).toMatch(/expired/);
  });

  it("reports the bytes it holds on HEAD and resumes a PUT from there", async () => {
    const bytes = pngBytes(4000);
    const { presigned } = await browserUpload(app.url, "photo", bytes);
    const form = new FormData();
    form.append("file", new Blob([bytes.slice(0, 1500)]), "trench.png");
    const partial = await fetch(presigned.url, { method: "PUT", body: form, headers: { Range: "bytes=0-" } });
    expect(((await partial.json()) as any).error).toMatch(/1500 of 4000/);
    const head = await fetch(presigned.url, { method: "HEAD" });
    expect(head.headers.get("x-ut-range-start")).toBe("1500");
    const wrongStart = await putFrom(presigned.url, bytes, "trench.png", 0);
    expect(wrongStart.status).toBe(416);
    const rest = await putFrom(presigned.url, bytes, "trench.png");
    expect(rest.json.serverData).toEqual({ stored: "trench.png" });
    expect(new Uint8Array(await (await fetch(rest.json.ufsUrl, { headers: serverKey })).arrayBuffer())).toEqual(bytes);
  });

  it("answers CORS preflights for the browser", async () => {
    const res = await fetch(`${fake.url}/somekey`, { method: "OPTIONS" });
    expect(res.status).toBe(204);
    expect(res.headers.get("access-control-expose-headers")).toContain("x-ut-range-start");
  });
});
