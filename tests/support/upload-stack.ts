/**
 * The app's uploadthing route handler on a local port, against the local upload fake (production flow: the
 * fake POSTs the callback to the app), as the stack runs them. For integration tests of uploads.
 */
import http from "node:http";
import { mkdtemp } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import type { AddressInfo } from "node:net";
import { createRouteHandler } from "uploadthing/next";
import { uploadRouter } from "@/lib/server/uploads/file-router";
import { FAKE_UPLOADTHING_TOKEN, startUploadFake } from "@/lib/dev-services/upload-fake";

export type UploadStack = Awaited<ReturnType<typeof startUploadStack>>;

export async function startUploadStack() {
  process.env.LOAMWORK_FILES_DIR = await mkdtemp(path.join(os.tmpdir(), "loamwork-files-"));
  const fake = await startUploadFake({
    port: 0,
    dir: await mkdtemp(path.join(os.tmpdir(), "loamwork-fake-")),
    callbackTimeoutMs: 20_000,
  });
  // The app's server-side calls (reading an original, deleting a refused one) use UTApi, configured as in the stack.
  Object.assign(process.env, {
    UPLOADTHING_TOKEN: FAKE_UPLOADTHING_TOKEN,
    UPLOADTHING_API_URL: fake.url,
    UPLOADTHING_INGEST_URL: fake.url,
    UPLOADTHING_UFS_HOST: fake.ufs.ufsHost,
    UPLOADTHING_UFS_APP_ID_LOCATION: fake.ufs.ufsAppIdLocation,
  });
  const handlers = createRouteHandler({
    router: uploadRouter,
    config: { token: FAKE_UPLOADTHING_TOKEN, ingestUrl: fake.url, isDev: false, logLevel: "Error" },
  });
  const server = http.createServer(async (req, res) => {
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const request = new Request(`http://${req.headers.host}${req.url}`, {
      method: req.method,
      headers: req.headers as Record<string, string>,
      body: chunks.length ? Buffer.concat(chunks) : undefined,
    });
    const out = await (req.method === "POST" ? handlers.POST(request as never) : handlers.GET(request as never));
    res.writeHead(out.status, Object.fromEntries(out.headers.entries()));
    res.end(Buffer.from(await out.arrayBuffer()));
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", () => r()));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

  /** Step 1 of an upload: the app's middleware answers presigned URLs, or refuses. */
  async function requestUpload(
    slug: string,
    file: { name: string; size: number; type: string },
    input: unknown,
    headers: Record<string, string> = {},
  ) {
    const res = await fetch(`${url}/api/uploadthing?actionType=upload&slug=${slug}`, {
      method: "POST",
      headers: { "content-type": "application/json", ...headers },
      body: JSON.stringify({ files: [{ ...file, lastModified: 1 }], input }),
    });
    return { status: res.status, json: (await res.json()) as any };
  }

  /** Step 2: the bytes to the fake, which calls the app back and answers with the app's server data. */
  async function put(presignedUrl: string, bytes: Buffer, name: string, type: string) {
    const form = new FormData();
    form.append("file", new Blob([new Uint8Array(bytes)], { type }), name);
    const res = await fetch(presignedUrl, { method: "PUT", body: form, headers: { Range: "bytes=0-" } });
    return (await res.json()) as any;
  }

  return {
    url,
    fake,
    requestUpload,
    put,
    close: async () => {
      await new Promise<void>((r) => server.close(() => r()));
      await fake.stop();
    },
  };
}
