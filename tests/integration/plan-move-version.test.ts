import { afterEach, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { session } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import * as findRoute from "@/app/api/sites/[siteId]/finds/[findId]/route";
import { moveFind } from "@/components/plan/move-find";
import { insertFind } from "./role-cases/core";

/**
 * The plan's drag-to-move (components/plan/move-find.ts) through the browser's own API client, its requests
 * answered by the real route handler: the move carries the version the plan read as If-Match, and a find
 * changed by someone else since is not moved over but reported with the find as it is now.
 */
type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const seen: Request[] = [];

function serveFindRoute() {
  vi.stubGlobal("fetch", async (url: string, init: RequestInit) => {
    const req = new Request(new URL(url, "http://localhost"), init);
    seen.push(req.clone());
    const m = /^\/api\/sites\/([^/]+)\/finds\/([^/]+)$/.exec(new URL(req.url).pathname);
    if (!m) throw new Error(`no route for ${url} in this test`);
    const handler = (findRoute as unknown as Record<string, Handler>)[req.method]!;
    return handler(req, { params: Promise.resolve({ siteId: m[1]!, findId: m[2]! }) });
  });
}
afterEach(() => {
  vi.unstubAllGlobals();
  seen.length = 0;
});

const stored = async (id: string) => {
  const [row] = await (await getDb()).select().from(schema.finds).where(eq(schema.finds.id, id));
  return row!;
};

describe("moving a find on the plan", () => {
  it("sends the version the plan read as If-Match and gets the next version back for the next move", async () => {
    const fx = await makeSite();
    const f = await insertFind(fx);
    session.userId = fx.people.digger.id;
    serveFindRoute();
    const first = await moveFind(fx.site.id, { id: f.id, number: f.number, version: f.version }, [2, 1.5]);
    expect(seen[0]!.headers.get("if-match")).toBe(`"${f.version}"`);
    expect(first).toEqual({ ok: true, version: f.version + 1 });
    const second = await moveFind(fx.site.id, { id: f.id, number: f.number, version: 2 }, [2.5, 1.5]);
    expect(seen[1]!.headers.get("if-match")).toBe('"2"');
    expect(second).toEqual({ ok: true, version: 3 });
    expect(await stored(f.id)).toMatchObject({ x: 2.5, y: 1.5, version: 3 });
  });

  it("a move made on a version someone else has since changed is refused and reported with the find as it is now", async () => {
    const fx = await makeSite();
    const f = await insertFind(fx);
    // Someone else (the director, on another device) moves the find after the digger's plan read it.
    const db = await getDb();
    await db.update(schema.finds).set({ x: 7, y: 5, version: 2 }).where(eq(schema.finds.id, f.id));
    session.userId = fx.people.digger.id;
    serveFindRoute();
    const out = await moveFind(fx.site.id, { id: f.id, number: f.number, version: 1 }, [2, 1.5]);
    expect(out.ok).toBe(false);
    if (out.ok) return;
    expect(out.current).toEqual({ x: 7, y: 5, z: null, version: 2, contextId: fx.context.id });
    expect(out.message).toContain(`Find #${f.number} was not moved`);
    expect(out.message).toContain("version 2, at 7.000, 5.000");
    // Nothing was written over the newer version.
    expect(await stored(f.id)).toMatchObject({ x: 7, y: 5, version: 2 });
  });

  it("a find not yet sent (no version read) is moved without a version check", async () => {
    const fx = await makeSite();
    const f = await insertFind(fx);
    session.userId = fx.people.digger.id;
    serveFindRoute();
    const out = await moveFind(fx.site.id, { id: f.id, number: f.number }, [3, 1]);
    expect(seen[0]!.headers.get("if-match")).toBeNull();
    expect(out).toEqual({ ok: true, version: 2 });
  });
});
