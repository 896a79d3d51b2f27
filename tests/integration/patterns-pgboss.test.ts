/**
 * The PostgreSQL path of runs: the app sends a run to pg-boss and a separate worker process
 * (`npm run worker`, scripts/worker.ts) takes it, computes it and writes the result back; a cancel from
 * the app stops the worker's run. Uses the database the suite gives this file when it runs beside a
 * server (scripts/with-postgres.sh); otherwise starts a throwaway cluster on a loopback port. Skipped,
 * with a message, only when no PostgreSQL binaries exist.
 */
import type pg from "pg";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { testViews } from "@/lib/patterns-view/test-view";
import { startRunWorker, stopRunWorker, untilReady, type RunWorker } from "../support/run-worker";

/**
 * Everything the environment needs is settled here, before any module reads it (lib/env caches it): the
 * queue kind, and — when the suite does not already give this file a database (scripts/with-postgres.sh
 * and tests/support/pg-per-file.ts) — a throwaway cluster on a free loopback port with a database.
 */
const setup = await vi.hoisted(async () => {
  process.env.LOAMWORK_RUN_QUEUE = "pg-boss";
  const { throwawayPostgres } = await import("../support/throwaway-postgres");
  return throwawayPostgres("runs");
});
if (!setup.available)
  console.warn(
    "patterns-pgboss: skipped — no PostgreSQL binaries under /usr/lib/postgresql and no server given by the suite.",
  );

let worker: RunWorker | undefined;
/** The worker's output so far, for the messages of failing checks. */
const workerLog = () => worker?.log ?? "";

describe.skipIf(!setup.available)("runs through pg-boss and a separate worker process", () => {
  let d: { siteId: string; trenchId: string; ctx: string; flk: string; specialist: string };
  let mods: Awaited<ReturnType<typeof load>>;
  const load = async () => ({
    client: await import("@/db/client"),
    s: await import("@/db/schema"),
    demo: await import("../support/demo-site"),
    runner: await import("@/lib/server/jobs/run-queue"),
    runsRoute: await import("@/app/api/sites/[siteId]/runs/route"),
    runRoute: await import("@/app/api/sites/[siteId]/runs/[runId]/route"),
    cancelRoute: await import("@/app/api/sites/[siteId]/runs/[runId]/cancel/route"),
    eventsRoute: await import("@/app/api/sites/[siteId]/runs/[runId]/events/route"),
  });

  beforeAll(async () => {
    mods = await load();
    expect(mods.runner.runQueueKind()).toBe("pg-boss");
    const demo = await mods.demo.seedDemoSite();
    d = {
      siteId: demo.siteId,
      trenchId: demo.trenchId,
      ctx: demo.ctx[1005]!,
      flk: demo.cls.FLK!,
      specialist: demo.people.specialist!,
    };
    // The worker is its own process, started as `npm run worker` starts it.
    worker = startRunWorker();
    await untilReady([worker]);
    expect(worker.log).toContain("run worker ready");
  }, 120_000);

  afterAll(async () => {
    await stopRunWorker(worker);
    await mods?.runner.stopRunQueue();
    await mods?.client.closeDb();
    setup.stop();
  }, 60_000);

  /** The specialist's run of the L-function envelope on FLK in context 1005, as the Patterns page sends it. */
  const queueRun = (nsim: number, seed: number) =>
    call(
      mods.runsRoute,
      "POST",
      { siteId: d.siteId },
      {
        scope: { trenchId: d.trenchId, contextIds: [d.ctx], classIds: [d.flk] },
        tests: [{ kind: "l-envelope" }],
        params: { nsim, seed },
      },
    );

  const waitFor = async (runId: string, want: (row: { status: string; progress: number }) => boolean) => {
    const db = await mods.client.getDb();
    for (let i = 0; i < 1200; i++) {
      const [row] = await db.select().from(mods.s.analysisRuns).where(eq(mods.s.analysisRuns.id, runId));
      if (want(row)) return row;
      if (row.status === "failed") throw new Error(`run failed: ${row.error}\n${workerLog()}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error(`the run never reached the wanted state\n${workerLog()}`);
  };

  it("the app only queues the run; the worker process computes it (FLK clustered)", async () => {
    session.userId = d.specialist;
    const res = await queueRun(99, 3);
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    expect(res.json.status).toBe("queued");
    await waitFor(res.json.id, (r) => r.status === "done");
    const read = await call(mods.runRoute, "GET", { siteId: d.siteId, runId: res.json.id });
    expect(read.json.progress).toBe(1);
    expect(testViews(read.json.result)[0]!.verdict).toBe("clustered");
    expect(read.json.outOfDate).toBe(false);
  }, 120_000);

  it("a cancel from the app stops the run in the worker", async () => {
    session.userId = d.specialist;
    const res = await queueRun(9999, 4);
    await waitFor(res.json.id, (r) => r.status === "running" && r.progress > 0);
    expect((await call(mods.cancelRoute, "POST", { siteId: d.siteId, runId: res.json.id })).status).toBe(200);
    // The worker's job ends (pg-boss marks it completed) without writing a result.
    const db = await mods.client.getDb();
    for (let i = 0; ; i++) {
      const { rows } = await (db as unknown as { $client: pg.Pool }).$client.query(
        "select state from pgboss.job where data->>'runId' = $1",
        [res.json.id],
      );
      if (rows[0]?.state === "completed") break;
      if (i > 600) throw new Error(`the worker did not stop the run\n${workerLog()}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    const read = await call(mods.runRoute, "GET", { siteId: d.siteId, runId: res.json.id });
    expect(read.json.status).toBe("cancelled");
    expect(read.json.result).toBeNull();
  }, 120_000);

  it("the app's event stream follows the run the worker computes: progress as it rises, then the result", async () => {
    session.userId = d.specialist;
    const res = await queueRun(4999, 5);
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    const stream = await mods.eventsRoute.GET(new Request("http://localhost/api/test"), {
      params: Promise.resolve({ siteId: d.siteId, runId: res.json.id }),
    });
    expect(stream.status).toBe(200);
    // Server-sent events as an EventSource reads them: blocks apart by a blank line; keep-alive comments skipped.
    const text = await stream.text();
    const events = text
      .split("\n\n")
      .filter((b) => b.startsWith("event: "))
      .map((b) => ({ event: /^event: (.*)$/m.exec(b)![1], data: JSON.parse(/^data: (.*)$/m.exec(b)![1]) }));
    const progress = events.filter((e) => e.event === "progress").map((e) => e.data.progress as number);
    expect(progress.length, workerLog()).toBeGreaterThan(2);
    expect(progress).toEqual([...progress].sort((a, b) => a - b));
    expect(progress.at(-1)).toBeGreaterThan(0.5);
    const last = events.at(-1)!;
    expect(last.event).toBe("run");
    expect(last.data.status).toBe("done");
    expect(testViews(last.data.result)[0]!.verdict).toBe("clustered");
  }, 120_000);
});
