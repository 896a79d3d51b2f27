/**
 * A local stand-in for the uploadthing v7 service, speaking the protocol the real SDK speaks
 * (local-services.md, "Uploads"): presigned HEAD/PUT with signature, expiry and Range; route metadata;
 * the upload-complete callback to the app in the development flow (streamed back over the metadata
 * request) or the production flow (POST to the callback URL); callback results; file serving; and the
 * `/v6/` file-management calls UTApi makes. Requests are handled concurrently.
 *
 * Files are private, as the real service's private files are: `/f/<key>` (and `/a/<appId>/<key>`) serve
 * a file only on a URL signed with the apiKey (UTApi.generateSignedURL) or to a request carrying the
 * apiKey itself. Anyone else gets 403, so an original never leaks past the app's member-checked route.
 */
import http, { type IncomingMessage, type ServerResponse } from "node:http";
import { Readable } from "node:stream";
import type { AddressInfo } from "node:net";
import {
  checkPresigned,
  checkSignature,
  FAKE_UPLOADTHING_TOKEN,
  fileKeyOf,
  parseToken,
  sameSignature,
  sign,
  utParam,
  type FakeToken,
} from "./upload-fake-signing";
import { fakeStore, type FakeStore, type StoredMeta } from "./upload-fake-store";

export { FAKE_UPLOADTHING_TOKEN } from "./upload-fake-signing";

export type UploadFakeOptions = {
  port: number;
  dir: string;
  /** The app's URL, used when a route registration names no callback URL. */
  appUrl?: string;
  token?: string;
  host?: string;
  /** How long a PUT waits for the app's route metadata (the dev flow may send it after the PUT). */
  metadataWaitMs?: number;
  /** How long a PUT waits for the app's callback result when the client awaits server data. */
  callbackTimeoutMs?: number;
};

type Registration = {
  keys: Set<string>;
  metadata: Record<string, unknown>;
  isDev: boolean;
  callbackUrl: string;
  callbackSlug: string;
  awaitServerData: boolean;
  /** Development flow: the app's still-open metadata request, where callbacks are streamed as JSON lines. */
  stream: ServerResponse | null;
  delivered: Set<string>;
};

type CallbackResult = { callbackData?: unknown; error?: string };

const cors = {
  "access-control-allow-origin": "*",
  "access-control-allow-methods": "GET, HEAD, PUT, POST, OPTIONS",
  "access-control-allow-headers": "content-type, range, x-uploadthing-version, b3, traceparent, x-uploadthing-api-key",
  "access-control-expose-headers": "x-ut-range-start",
};

function send(res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}) {
  if (res.headersSent) return;
  res.writeHead(status, { ...cors, "content-type": "application/json", ...headers });
  res.end(JSON.stringify(body));
}

async function readJson(req: IncomingMessage): Promise<Record<string, unknown>> {
  const chunks: Buffer[] = [];
  for await (const c of req) chunks.push(c as Buffer);
  const text = Buffer.concat(chunks).toString("utf8");
  return text ? JSON.parse(text) : {};
}

/** A promise that some later event settles, with a timeout. */
function waiter<T>() {
  let resolve!: (v: T) => void;
  const promise = new Promise<T>((r) => (resolve = r));
  return { promise, resolve };
}

function withTimeout<T>(p: Promise<T>, ms: number, fallback: T): Promise<T> {
  return new Promise((resolve) => {
    const t = setTimeout(() => resolve(fallback), ms);
    p.then((v) => {
      clearTimeout(t);
      resolve(v);
    });
  });
}

export type UploadFake = {
  url: string;
  /**
   * What the app's UTApi needs to sign file URLs for this stand-in: UPLOADTHING_UFS_HOST (a host with
   * "local" in it, so the SDK writes http) and UPLOADTHING_UFS_APP_ID_LOCATION.
   */
  ufs: { ufsHost: string; ufsAppIdLocation: "path" };
  stop(): Promise<void>;
};

export async function startUploadFake(options: UploadFakeOptions): Promise<UploadFake> {
  const token: FakeToken = parseToken(options.token ?? FAKE_UPLOADTHING_TOKEN);
  const store: FakeStore = fakeStore(options.dir);
  await store.init();
  const registrations = new Map<string, Registration>();
  const registered = new Map<string, ReturnType<typeof waiter<Registration>>>();
  const results = new Map<string, ReturnType<typeof waiter<CallbackResult>>>();
  const metadataWaitMs = options.metadataWaitMs ?? 10_000;
  const callbackTimeoutMs = options.callbackTimeoutMs ?? 30_000;
  let origin = "";

  const registrationFor = (key: string) => {
    const known = registrations.get(key);
    if (known) return Promise.resolve(known);
    let w = registered.get(key);
    if (!w) registered.set(key, (w = waiter<Registration>()));
    return withTimeout<Registration | null>(w.promise, metadataWaitMs, null);
  };
  const resultFor = (key: string) => {
    let w = results.get(key);
    if (!w) results.set(key, (w = waiter<CallbackResult>()));
    return w;
  };
  const fileData = (m: StoredMeta) => {
    const url = `${origin}/f/${encodeURIComponent(m.key)}`;
    return {
      name: m.name,
      size: m.size,
      type: m.type,
      customId: m.customId,
      lastModified: m.lastModified,
      key: m.key,
      url,
      appUrl: url,
      ufsUrl: url,
      fileHash: m.fileHash ?? "",
    };
  };
  const apiKeyOk = (req: IncomingMessage) => {
    const given = req.headers["x-uploadthing-api-key"];
    return typeof given === "string" && sameSignature(given, token.apiKey);
  };

  /** Delivers one hook to the app, by stream (dev) or POST (production). Resolves false if the app refused it. */
  async function deliver(
    reg: Registration,
    key: string,
    hook: "callback" | "error",
    payload: string,
  ): Promise<boolean> {
    const signature = sign(payload, token.apiKey);
    reg.delivered.add(key);
    if (reg.isDev) {
      if (!reg.stream || reg.stream.writableEnded) return false;
      reg.stream.write(JSON.stringify({ payload, signature, hook }) + "\n");
      if ([...reg.keys].every((k) => reg.delivered.has(k))) reg.stream.end();
      return true;
    }
    const target = new URL(reg.callbackUrl || `${options.appUrl ?? ""}/api/uploadthing`);
    if (!target.searchParams.has("slug")) target.searchParams.set("slug", reg.callbackSlug);
    try {
      const res = await fetch(target, {
        method: "POST",
        headers: { "content-type": "application/json", "uploadthing-hook": hook, "x-uploadthing-signature": signature },
        body: payload,
      });
      await res.arrayBuffer();
      return res.ok;
    } catch {
      return false;
    }
  }

  async function onRouteMetadata(req: IncomingMessage, res: ServerResponse) {
    if (!apiKeyOk(req)) return send(res, 401, { error: "Invalid or missing x-uploadthing-api-key." });
    const body = await readJson(req);
    if (!Array.isArray(body.fileKeys) || typeof body.callbackSlug !== "string")
      return send(res, 400, { error: "route-metadata needs fileKeys and callbackSlug." });
    const reg: Registration = {
      keys: new Set(body.fileKeys.map(String)),
      metadata: (body.metadata ?? {}) as Record<string, unknown>,
      isDev: Boolean(body.isDev),
      callbackUrl: String(body.callbackUrl ?? ""),
      callbackSlug: body.callbackSlug,
      awaitServerData: body.awaitServerData !== false,
      stream: null,
      delivered: new Set(),
    };
    if (reg.isDev) {
      res.writeHead(200, { "content-type": "application/x-ndjson", "cache-control": "no-store" });
      res.flushHeaders();
      reg.stream = res;
      const keepOpen = setTimeout(() => res.end(), metadataWaitMs + callbackTimeoutMs * 2);
      res.on("close", () => clearTimeout(keepOpen));
    } else {
      send(res, 200, { ok: true });
    }
    for (const key of reg.keys) {
      registrations.set(key, reg);
      registered.get(key)?.resolve(reg);
    }
  }

  async function onPut(req: IncomingMessage, res: ServerResponse, base: string, target: string) {
    const check = checkPresigned(base, target, token);
    if (!check.ok) return send(res, check.status, { error: check.error });
    const { key, params } = check;
    const size = Number(utParam(params, "x-ut-file-size"));
    const range = /^bytes=(\d+)-$/.exec(String(req.headers.range ?? "bytes=0-"));
    if (!range) return send(res, 416, { error: "Range must read bytes=<start>-." });
    const start = Number(range[1]);
    const prior = await store.meta(key);
    if (prior?.uploadedAt) return send(res, 409, { error: "This file key is already uploaded." });
    if (start !== (prior?.received ?? 0))
      return send(res, 416, { error: `Resume from byte ${prior?.received ?? 0}, not ${start}.` });
    let file: File | null = null;
    try {
      const form = await new Request(`http://fake${target}`, {
        method: "PUT",
        headers: req.headers as Record<string, string>,
        body: Readable.toWeb(req) as ReadableStream,
        duplex: "half",
      } as RequestInit).formData();
      const f = form.get("file");
      file = typeof f === "string" || f === null ? null : f;
    } catch {
      return send(res, 400, { error: "The upload body must be multipart/form-data with a file field." });
    }
    if (!file) return send(res, 400, { error: "The upload has no file field." });
    const bytes = new Uint8Array(await file.arrayBuffer());
    if (start + bytes.length > size)
      return send(res, 400, { error: `The file is larger than the ${size} bytes the URL was signed for.` });
    const stored = await store.write(
      {
        key,
        name: utParam(params, "x-ut-file-name") ?? "file",
        size,
        type: utParam(params, "x-ut-file-type") ?? "application/octet-stream",
        customId: utParam(params, "x-ut-custom-id") ?? null,
        lastModified: Date.now(),
      },
      start,
      bytes,
    );
    if (!stored.uploadedAt)
      return send(res, 400, {
        error: `Incomplete upload: ${stored.received} of ${size} bytes received; resume from there.`,
      });
    const data = fileData(stored);
    const slug = utParam(params, "x-ut-slug");
    if (!slug) return send(res, 200, data); // UTApi.uploadFiles: no route, no callback.
    const reg = await registrationFor(key);
    if (!reg) return send(res, 200, { ...data, error: "The app never registered route metadata for this upload." });
    const result = resultFor(key);
    const payload = JSON.stringify({ status: "uploaded", file: data, origin, metadata: reg.metadata });
    const delivering = deliver(reg, key, "callback", payload);
    if (!reg.awaitServerData) {
      void delivering;
      return send(res, 200, { ...data, serverData: null });
    }
    const accepted = await delivering;
    if (!accepted) return send(res, 200, { ...data, error: "The app refused the upload-complete callback." });
    const outcome = await withTimeout<CallbackResult>(result.promise, callbackTimeoutMs, {
      error: "The app did not confirm the upload in time.",
    });
    results.delete(key);
    if (outcome.error) return send(res, 200, { ...data, error: outcome.error });
    send(res, 200, { ...data, serverData: outcome.callbackData ?? null });
  }

  async function onCallbackResult(req: IncomingMessage, res: ServerResponse) {
    if (!apiKeyOk(req)) return send(res, 401, { error: "Invalid or missing x-uploadthing-api-key." });
    const body = await readJson(req);
    if (typeof body.fileKey !== "string") return send(res, 400, { error: "callback-result needs fileKey." });
    resultFor(body.fileKey).resolve(
      body.error ? { error: String(body.error) } : { callbackData: body.callbackData ?? null },
    );
    send(res, 200, { ok: true });
  }

  async function onApi(req: IncomingMessage, res: ServerResponse, op: string) {
    if (!apiKeyOk(req)) return send(res, 401, { error: "Invalid or missing x-uploadthing-api-key." });
    const body = await readJson(req);
    const keys: string[] = Array.isArray(body.fileKeys) ? body.fileKeys.map(String) : [];
    if (op === "deleteFiles") {
      let deletedCount = 0;
      for (const k of keys) if (await store.remove(k)) deletedCount++;
      return send(res, 200, { success: true, deletedCount });
    }
    if (op === "getFileUrl")
      return send(res, 200, { data: keys.map((k) => ({ key: k, url: `${origin}/f/${encodeURIComponent(k)}` })) });
    if (op === "listFiles") {
      const all = await store.list();
      const offset = Number(body.offset ?? 0);
      const limit = Number(body.limit ?? 500);
      const page = all.slice(offset, offset + limit).map((m) => ({
        id: m.key,
        customId: m.customId,
        key: m.key,
        name: m.name,
        size: m.size,
        status: m.uploadedAt ? "Uploaded" : "Uploading",
        uploadedAt: m.uploadedAt ?? 0,
      }));
      return send(res, 200, { hasMore: offset + limit < all.length, files: page });
    }
    send(res, 404, { error: `The local upload fake does not implement /v6/${op}.` });
  }

  async function route(req: IncomingMessage, res: ServerResponse) {
    const target = req.url ?? "/";
    const base = `http://${req.headers.host}`;
    const pathname = new URL(target, "http://fake").pathname;
    if (req.method === "OPTIONS") {
      res.writeHead(204, cors);
      return res.end();
    }
    if (req.method === "POST" && pathname === "/route-metadata") return onRouteMetadata(req, res);
    if (req.method === "POST" && pathname === "/callback-result") return onCallbackResult(req, res);
    if (req.method === "POST" && pathname.startsWith("/v6/")) return onApi(req, res, pathname.slice(4));
    const fileKey = req.method === "GET" || req.method === "HEAD" ? fileKeyOf(pathname, token) : null;
    if (fileKey !== null) {
      if (!apiKeyOk(req)) {
        const check = checkSignature(base, target, token, Date.now(), "file URL");
        if (!check.ok)
          return send(res, check.status, { error: `${check.error} Files here are private: ask the app for them.` });
      }
      const key = fileKey;
      const m = await store.meta(key);
      if (!m?.uploadedAt) return send(res, 404, { error: "No such file." });
      const data = await store.read(key);
      res.writeHead(200, {
        ...cors,
        "content-type": m.type,
        "content-length": String(data.length),
        "cache-control": "private, no-store",
      });
      return res.end(req.method === "HEAD" ? undefined : data);
    }
    if (req.method === "HEAD") {
      const check = checkPresigned(base, target, token);
      if (!check.ok) {
        res.writeHead(check.status, cors);
        return res.end();
      }
      res.writeHead(200, { ...cors, "x-ut-range-start": String(await store.received(check.key)) });
      return res.end();
    }
    if (req.method === "PUT") return onPut(req, res, base, target);
    send(res, 404, { error: `The local upload fake has no ${req.method} ${pathname}.` });
  }

  const server = http.createServer((req, res) => {
    route(req, res).catch((err) => {
      console.error("[upload-fake]", err);
      send(res, 500, { error: "The upload fake failed; see its log." });
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port, options.host ?? "127.0.0.1", () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  origin = `http://${options.host ?? "127.0.0.1"}:${port}`;
  return {
    url: origin,
    ufs: { ufsHost: `localhost:${port}`, ufsAppIdLocation: "path" },
    stop: () =>
      new Promise<void>((resolve) => {
        for (const reg of registrations.values()) if (reg.stream && !reg.stream.writableEnded) reg.stream.end();
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
