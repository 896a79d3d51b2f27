/**
 * A run followed as server-sent events (GET …/runs/{runId}/events), the way the Patterns page follows
 * it: the run first, progress as the simulations go, the finished run last, then the stream ends. Also a
 * finished run (one event), a cancelled run, a stranger and an unknown run.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { session, call } from "../support/harness";
import { seedDemoSite, type DemoSite } from "../support/demo-site";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { runsIdle } from "@/lib/server/jobs/run-queue";
import * as runsRoute from "@/app/api/sites/[siteId]/runs/route";
import * as runRoute from "@/app/api/sites/[siteId]/runs/[runId]/route";
import * as eventsRoute from "@/app/api/sites/[siteId]/runs/[runId]/events/route";
import * as cancelRoute from "@/app/api/sites/[siteId]/runs/[runId]/cancel/route";
import { testViews } from "@/lib/patterns-view/test-view";

let d: DemoSite;

beforeAll(async () => {
  d = await seedDemoSite();
});

/** Besag's L on the given classes of context 1005; four classes at 9999 simulations take a few seconds. */
async function start(classCodes: string[], nsim: number, seed: number) {
  session.userId = d.people.specialist;
  const res = await call(
    runsRoute,
    "POST",
    { siteId: d.siteId },
    {
      scope: { trenchId: d.trenchId, contextIds: [d.ctx[1005]], classIds: classCodes.map((c) => d.cls[c]) },
      tests: [{ kind: "l-envelope" }],
      params: { nsim, seed },
    },
  );
  expect(res.status, JSON.stringify(res.json)).toBe(201);
  return res.json.id as string;
}

type Sse = { event: string; data: any };

/** Opens the stream and reads it as the browser's EventSource would; `onEvent` may act while it runs. */
async function follow(
  runId: string,
  onEvent?: (e: Sse) => Promise<void> | void,
): Promise<{ status: number; events: Sse[] }> {
  const req = new Request("http://localhost/api/test", { method: "GET" });
  const res = await eventsRoute.GET(req, { params: Promise.resolve({ siteId: d.siteId, runId }) });
  if (res.status !== 200) return { status: res.status, events: [] };
  expect(res.headers.get("content-type")).toContain("text/event-stream");
  const events: Sse[] = [];
  const reader = res.body!.pipeThrough(new TextDecoderStream()).getReader();
  let buffer = "";
  for (;;) {
    const { value, done } = await reader.read();
    if (done) break;
    buffer += value;
    let end: number;
    while ((end = buffer.indexOf("\n\n")) >= 0) {
      const block = buffer.slice(0, end);
      buffer = buffer.slice(end + 2);
      const event = /^event: (.*)$/m.exec(block)?.[1];
      const data = /^data: (.*)$/m.exec(block)?.[1];
      if (!event || data === undefined) continue; // a keep-alive comment
      const e = { event, data: JSON.parse(data) };
      events.push(e);
      await onEvent?.(e);
    }
  }
  return { status: res.status, events };
}

describe("run events", () => {
  it("streams the run, its progress as it rises, and the finished run with its result, then ends", async () => {
    const id = await start(["FLK", "SHD", "FCR", "CHP"], 9999, 77);
    const { status, events } = await follow(id);
    expect(status).toBe(200);
    expect(events[0].event).toBe("run");
    expect(events[0].data.id).toBe(id);
    expect(["queued", "running"]).toContain(events[0].data.status);
    const progress = events.filter((e) => e.event === "progress").map((e) => e.data);
    expect(progress.length).toBeGreaterThan(2);
    for (const p of progress) {
      expect(p.status).toBe("running");
      expect(p.progress).toBeGreaterThanOrEqual(0);
      expect(p.progress).toBeLessThan(1);
      expect(Date.parse(p.now)).toBeGreaterThanOrEqual(Date.parse(p.startedAt));
    }
    const values = progress.map((p) => p.progress);
    expect(values).toEqual([...values].sort((a, b) => a - b));
    expect(values.at(-1)).toBeGreaterThan(0.5);
    const last = events.at(-1)!;
    expect(last.event).toBe("run");
    expect(last.data.status).toBe("done");
    expect(last.data.progress).toBe(1);
    expect(last.data.outOfDate).toBe(false);
    // the same run as the JSON route reads it
    const read = (await call(runRoute, "GET", { siteId: d.siteId, runId: id })).json;
    expect(last.data.result.results).toEqual(read.result.results);
    const flk = testViews(last.data.result).find((t) => "classId" in t && t.classId === d.cls.FLK)!;
    expect(flk.verdict).toBe("clustered");
    const timing = last.data.result.timing;
    expect(timing.engineEnd).toBeGreaterThan(timing.engineStart);
    expect(timing.engineStart).toBeGreaterThanOrEqual(Date.parse(last.data.startedAt));
  });

  it("streams the progress of a run of square-count tests alone as it rises to completion", async () => {
    session.userId = d.people.specialist;
    const res = await call(
      runsRoute,
      "POST",
      { siteId: d.siteId },
      {
        scope: {
          trenchId: d.trenchId,
          contextIds: [d.ctx[1005]],
          classIds: ["FLK", "SHD", "FCR", "CHP"].map((c) => d.cls[c]),
        },
        tests: [],
        squareTests: [{ kind: "moran" }, { kind: "getis-ord" }],
        params: { nsim: 9999, seed: 21 },
      },
    );
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    const { events } = await follow(res.json.id);
    const values = events.filter((e) => e.event === "progress").map((e) => e.data.progress as number);
    // The permutations report as they go: values between 0 and 1, rising. How many reach the stream depends
    // on the machine's speed (writes are thinned to ten a second; a quiet machine ends the run within a few),
    // so at least one; before square tests reported progress there were none. The engine's own progress
    // steps are counted exactly in lib/spatial/lattice/run-square-test.test.ts.
    expect(values.length).toBeGreaterThan(0);
    expect(values).toEqual([...values].sort((a, b) => a - b));
    // The first may be the run's start (running, 0); the permutations' own reports come after it.
    expect(values[0]).toBeGreaterThanOrEqual(0);
    expect(values.filter((v) => v > 0).length).toBeGreaterThan(0);
    expect(values.at(-1)).toBeLessThan(1);
    const last = events.at(-1)!;
    expect(last.data.status).toBe("done");
    expect(last.data.progress).toBe(1);
    expect(last.data.result.squareTests).toHaveLength(8);
  });

  it("gives a finished run as one event and ends", async () => {
    const id = await start(["SHD"], 99, 3);
    await runsIdle();
    session.userId = d.people.digger; // any member may watch
    const { events } = await follow(id);
    expect(events.map((e) => e.event)).toEqual(["run"]);
    expect(events[0].data.status).toBe("done");
  });

  it("ends with the cancelled run when the run is cancelled while watched", async () => {
    const id = await start(["FLK", "SHD", "FCR", "CHP"], 9999, 5);
    let cancelled = false;
    const { events } = await follow(id, async (e) => {
      if (!cancelled && e.event === "progress" && e.data.progress > 0) {
        cancelled = true;
        session.userId = d.people.specialist;
        const res = await call(cancelRoute, "POST", { siteId: d.siteId, runId: id });
        expect(res.status, JSON.stringify(res.json)).toBe(200);
      }
    });
    await runsIdle();
    expect(cancelled).toBe(true);
    const last = events.at(-1)!;
    expect(last.event).toBe("run");
    expect(last.data.status).toBe("cancelled");
    expect(last.data.result).toBeNull();
  });

  it("refuses a stranger, a signed-out caller and an unknown run", async () => {
    const id = await start(["SHD"], 99, 4);
    await runsIdle();
    session.userId = null;
    expect((await follow(id)).status).toBe(401);
    const db = await getDb();
    const [stranger] = await db
      .insert(s.users)
      .values({ email: "events-stranger@loamwork.test", name: "Stranger", passwordHash: "x" })
      .returning();
    session.userId = stranger.id;
    expect((await follow(id)).status).toBe(404);
    session.userId = d.people.specialist;
    expect((await follow("00000000-0000-4000-8000-000000000000")).status).toBe(404);
  });
});
