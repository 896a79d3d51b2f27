import { afterEach, describe, expect, it, vi } from "vitest";
import { ApiError, apiClient, buildRequest } from "./client";

const siteId = "5f0c6a52-8a7e-4a57-9d3e-0a2b1c3d4e5f";
const findId = "0b7d1f7e-1c2a-4e0b-8f9a-6c5d4e3f2a1b";

type Sent = { url: string; init: RequestInit };
function answer(status: number, body: unknown): Sent[] {
  const sent: Sent[] = [];
  vi.stubGlobal("fetch", async (url: string, init: RequestInit) => {
    sent.push({ url, init });
    return new Response(body === undefined ? "" : JSON.stringify(body), {
      status,
      headers: { "content-type": "application/json" },
    });
  });
  return sent;
}

afterEach(() => vi.unstubAllGlobals());

describe("buildRequest", () => {
  it("fills the path from the catalogue and sends a write's input as JSON", () => {
    const req = buildRequest("findUpdate", { siteId, findId }, { x: 1.5, y: 2 }, { "idempotency-key": "k-1" });
    expect(req).toEqual({
      operation: "findUpdate",
      method: "PATCH",
      url: `/api/sites/${siteId}/finds/${findId}`,
      headers: { "idempotency-key": "k-1", "content-type": "application/json" },
      body: JSON.stringify({ x: 1.5, y: 2 }),
    });
  });

  it("puts a list's input in the query string, leaving out empty values", () => {
    const req = buildRequest("findsList", { siteId }, { trenchId: findId, page: 2, q: "", classId: undefined });
    expect(req.method).toBe("GET");
    expect(req.url).toBe(`/api/sites/${siteId}/finds?trenchId=${findId}&page=2`);
    expect(req.body).toBeUndefined();
  });

  it("sends no body where the operation takes none", () => {
    const req = buildRequest("runCancel", { siteId, runId: findId });
    expect(req).toEqual({
      operation: "runCancel",
      method: "POST",
      url: `/api/sites/${siteId}/runs/${findId}/cancel`,
      headers: {},
    });
  });

  it("refuses a path with a missing part instead of calling a wrong address", () => {
    expect(() => buildRequest("findRead", { siteId, findId: "" })).toThrow("findRead: the path needs findId");
  });
});

describe("apiClient.call", () => {
  it("returns the server's answer", async () => {
    const sent = answer(201, { id: findId, number: 7 });
    const out = await apiClient.call("findsCreate", { siteId }, { contextId: findId, classId: findId, x: 1, y: 2 });
    expect(out).toEqual({ id: findId, number: 7 });
    expect(sent[0].url).toBe(`/api/sites/${siteId}/finds`);
    expect(sent[0].init.method).toBe("POST");
  });

  it("turns a refusal into one ApiError with status, message, field errors and details", async () => {
    answer(400, {
      error: "The find is outside its trench.",
      fieldErrors: { x: ["0.4 m outside"] },
      details: { distance: 0.4 },
    });
    const err = await apiClient
      .call("findsCreate", { siteId }, { contextId: findId, classId: findId, x: 11, y: 2 })
      .catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    const e = err as ApiError;
    expect([e.status, e.message, e.fieldErrors, e.hasFieldErrors, e.detail("distance")]).toEqual([
      400,
      "The find is outside its trench.",
      { x: ["0.4 m outside"] },
      true,
      0.4,
    ]);
  });

  it("names the status when the server's answer is not JSON", async () => {
    vi.stubGlobal("fetch", async () => new Response("<html>Bad gateway</html>", { status: 502 }));
    const err = (await apiClient.call("classesList", { siteId }).catch((e: unknown) => e)) as ApiError;
    expect([err.status, err.message, err.hasFieldErrors]).toEqual([502, "The server answered 502.", false]);
  });
});
