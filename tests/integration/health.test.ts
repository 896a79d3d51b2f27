import { describe, expect, it, vi } from "vitest";

/** When set, opening the database fails, as it does when the server is down or its files are locked. */
const broken = { db: false };
vi.mock("@/db/client", async (importOriginal) => {
  const real = await importOriginal<typeof import("@/db/client")>();
  return { ...real, getDb: () => (broken.db ? Promise.reject(new Error("connection refused")) : real.getDb()) };
});

const { GET } = await import("@/app/api/health/route");

describe("GET /api/health", () => {
  it("says ok when the database answers", async () => {
    broken.db = false;
    const res = await GET();
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ status: "ok", database: "ok" });
  });

  it("says degraded, 503, when the database does not", async () => {
    broken.db = true;
    const res = await GET();
    expect(res.status).toBe(503);
    expect(await res.json()).toEqual({ status: "degraded", database: "unreachable" });
  });
});
