import { describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { session } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as importPreviewRoute from "@/app/api/sites/[siteId]/import/preview/route";
import * as resetRequestRoute from "@/app/api/auth-extra/password-reset/request/route";
import { DEFAULT_BODY_LIMIT, PUBLIC_BODY_LIMIT, withBodyLimit } from "@/lib/server/http";
import { MAX_IMPORT_BODY_BYTES } from "@/lib/schemas/import";

const MB = 1024 * 1024;
const CHUNK = 64 * 1024;

/** A request body of `total` bytes that counts how many bytes the server actually pulled from it. */
function countingBody(total: number) {
  const counter = { pulled: 0 };
  const chunk = new Uint8Array(CHUNK).fill(0x20); // spaces: valid JSON whitespace, however much is read
  const stream = new ReadableStream<Uint8Array>(
    {
      pull(controller) {
        if (counter.pulled >= total) return controller.close();
        const n = Math.min(CHUNK, total - counter.pulled);
        counter.pulled += n;
        controller.enqueue(n === CHUNK ? chunk : chunk.subarray(0, n));
      },
    },
    { highWaterMark: 0 },
  );
  return { stream, counter };
}

function post(body: BodyInit, headers: Record<string, string> = {}) {
  return new Request("http://localhost/api/test", {
    method: "POST",
    headers: { "content-type": "application/json", ...headers },
    body,
    duplex: "half",
  } as RequestInit);
}

async function send(
  handler: (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>,
  req: Request,
  params: Record<string, string>,
) {
  const res = await handler(req, { params: Promise.resolve(params) });
  return { status: res.status, json: await res.json() };
}

describe("request bodies are limited per entry, and read only after the caller is known", () => {
  it("refuses an oversized JSON body with 413 naming the limit, and records nothing", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const body = JSON.stringify({
      contextId: fx.context.id,
      classId: fx.cls.id,
      x: 1,
      y: 1,
      description: "x".repeat(DEFAULT_BODY_LIMIT),
    });
    const res = await send(findsRoute.POST, post(body), { siteId: fx.site.id });
    expect(res.status).toBe(413);
    expect(res.json.error).toMatch(/at most 256 KB/);
    const db = await getDb();
    expect(await db.select().from(schema.finds).where(eq(schema.finds.siteId, fx.site.id))).toHaveLength(0);
    const [site] = await db.select().from(schema.sites).where(eq(schema.sites.id, fx.site.id));
    expect(site.nextFindNumber).toBe(1);
  });

  it("answers a signed-out caller's 10 MB body with 401 without reading it", async () => {
    const fx = await makeSite();
    session.userId = null;
    const { stream, counter } = countingBody(10 * MB);
    const res = await send(findsRoute.POST, post(stream), { siteId: fx.site.id });
    expect(res.status).toBe(401);
    expect(counter.pulled).toBeLessThanOrEqual(CHUNK);
  });

  it("answers a stranger to the site 404 without reading a 10 MB body", async () => {
    const fx = await makeSite();
    session.userId = fx.people.stranger.id;
    const { stream, counter } = countingBody(10 * MB);
    const res = await send(findsRoute.POST, post(stream), { siteId: fx.site.id });
    expect(res.status).toBe(404);
    expect(counter.pulled).toBeLessThanOrEqual(CHUNK);
  });

  it("stops reading at the limit when Content-Length understates the body", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const { stream, counter } = countingBody(10 * MB);
    const res = await send(findsRoute.POST, post(stream, { "content-length": "100" }), { siteId: fx.site.id });
    expect(res.status).toBe(413);
    expect(counter.pulled).toBeLessThanOrEqual(DEFAULT_BODY_LIMIT + 2 * CHUNK);
  });

  it("refuses at once, reading nothing, when Content-Length declares more than the limit", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const { stream, counter } = countingBody(1024);
    const res = await send(findsRoute.POST, post(stream, { "content-length": String(10 * MB) }), {
      siteId: fx.site.id,
    });
    expect(res.status).toBe(413);
    expect(counter.pulled).toBeLessThanOrEqual(CHUNK);
  });

  it("lets an import carry a file beyond the JSON default, under its own larger limit", async () => {
    const fx = await makeSite();
    session.userId = fx.people.digger.id;
    const rows = Array.from(
      { length: 20_000 },
      (_, i) => `${i + 1},${(i % 10) / 2},${(i % 6) / 2},FL,${fx.context.number}`,
    );
    const csv = ["n,x,y,class,context", ...rows].join("\n");
    const body = JSON.stringify({ csv, fileName: "big.csv" });
    expect(body.length).toBeGreaterThan(DEFAULT_BODY_LIMIT);
    const res = await send(importPreviewRoute.POST, post(body), { siteId: fx.site.id });
    expect(res.status).toBe(200);
    const { stream } = countingBody(MAX_IMPORT_BODY_BYTES + CHUNK);
    const over = await send(importPreviewRoute.POST, post(stream), { siteId: fx.site.id });
    expect(over.status).toBe(413);
    expect(over.json.error).toMatch(/at most 48 MB/);
  });

  it("holds the entries used before sign-in to a small body", async () => {
    const res = await send(
      resetRequestRoute.POST as never,
      post(JSON.stringify({ email: `${"a".repeat(PUBLIC_BODY_LIMIT)}@test.invalid` })),
      {},
    );
    expect(res.status).toBe(413);
    expect(res.json.error).toMatch(/at most 16 KB/);
  });

  it("reads a self-reading handler's body under its limit before handing it on", async () => {
    let seen: string | null = null;
    const handler = withBodyLimit(1024, async (req) => {
      seen = await req.text();
      return new Response("{}");
    });
    const small = await handler(post("a=1&b=2") as never, undefined);
    expect([small.status, seen]).toEqual([200, "a=1&b=2"]);
    seen = null;
    const { stream, counter } = countingBody(10 * MB);
    const big = await handler(post(stream) as never, undefined);
    expect(big.status).toBe(413);
    expect(seen).toBeNull();
    expect(counter.pulled).toBeLessThanOrEqual(1024 + CHUNK);
  });
});
