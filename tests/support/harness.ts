import { beforeAll, vi } from "vitest";
import { getDb } from "@/db/client";

/** The user the mocked session reports; null = signed out. Set by each test. */
export const session = { userId: null as string | null };

vi.mock("@/lib/server/session", () => ({ currentUserId: async () => session.userId }));

// Open and migrate the database before the first test, under the hook timeout, so a loaded machine's slow
// start is not charged to whichever test happens to run first.
beforeAll(async () => {
  await getDb();
}, 120_000);

type RouteModule = Record<
  string,
  (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>
>;

/** Calls a route handler the way Next does, as `userId`, and returns status and parsed JSON. */
export async function call(
  mod: RouteModule,
  method: string,
  params: Record<string, string>,
  body?: unknown,
  query?: Record<string, string>,
): Promise<{ status: number; json: any }> {
  const handler = mod[method];
  if (!handler) throw new Error(`route has no ${method}`);
  const url = new URL("http://localhost/api/test");
  for (const [k, v] of Object.entries(query ?? {})) url.searchParams.set(k, v);
  const req = new Request(url, {
    method,
    headers: { "content-type": "application/json" },
    body: body === undefined || method === "GET" ? undefined : JSON.stringify(body),
  });
  const res = await handler(req, { params: Promise.resolve(params) });
  const text = await res.text();
  return { status: res.status, json: text ? JSON.parse(text) : null };
}
