/**
 * Several worker processes share one run (issue 18, beyond one machine): the worker that takes a run cuts
 * its simulations into chunk jobs, every worker takes chunks, and the merged numbers are those of a single
 * process with the same seed. A worker killed in the middle of a chunk loses nothing: once the chunk's time
 * runs out pg-boss offers it again and the other worker computes it. Two `npm run worker` processes against
 * the PostgreSQL server the suite gives this file (or a throwaway cluster, as patterns-pgboss.test.ts).
 */
import type pg from "pg";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { session, call } from "../support/harness";
import { startRunWorker, stopRunWorker, untilReady, type RunWorker } from "../support/run-worker";

/**
 * Everything the environment needs is settled here, before any module reads it (lib/env caches it): the
 * queue kind, and — when the suite does not already give this file a database (scripts/with-postgres.sh
 * and tests/support/pg-per-file.ts) — a throwaway cluster on a free loopback port with a database.
 */
const setup = await vi.hoisted(async () => {
  process.env.LOAMWORK_RUN_QUEUE = "pg-boss";
  const { throwawayPostgres } = await import("../support/throwaway-postgres");
  return throwawayPostgres("workers");
});
if (!setup.available)
  console.warn(
    "patterns-workers: skipped — no PostgreSQL binaries under /usr/lib/postgresql and no server given by the suite.",
  );

const workers: RunWorker[] = [];
/** Chunk time before a silent worker's chunk is offered again: short, so the test waits little for it. */
const EXPIRE_SECONDS = 8;

function startWorker(): RunWorker {
  const w = startRunWorker({
    LOAMWORK_WORKER_THREADS: "1",
    LOAMWORK_WORKER_LOG: "1",
    LOAMWORK_RUN_CHUNKS: "8",
    LOAMWORK_CHUNK_EXPIRE_SECONDS: String(EXPIRE_SECONDS),
  });
  workers.push(w);
  return w;
}

const until = async (what: string, ok: () => boolean, tries = 1200) => {
  for (let i = 0; i < tries; i++) {
    if (ok()) return;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`timed out waiting for ${what}\n${workers.map((w) => w.log).join("\n---\n")}`);
};

describe.skipIf(!setup.available)("one run shared by two worker processes", () => {
  let d: { siteId: string; trenchId: string; ctx: string; classes: string[]; specialist: string };
  let mods: Awaited<ReturnType<typeof load>>;
  const load = async () => ({
    client: await import("@/db/client"),
    s: await import("@/db/schema"),
    demo: await import("../support/demo-site"),
    runner: await import("@/lib/server/jobs/run-queue"),
    execute: await import("@/lib/server/analysis/execute-run"),
    runsRoute: await import("@/app/api/sites/[siteId]/runs/route"),
    runRoute: await import("@/app/api/sites/[siteId]/runs/[runId]/route"),
  });

  beforeAll(async () => {
    mods = await load();
    expect(mods.runner.runQueueKind()).toBe("pg-boss");
    const demo = await mods.demo.seedDemoSite();
    d = {
      siteId: demo.siteId,
      trenchId: demo.trenchId,
      ctx: demo.ctx[1005]!,
      // In the site's own order of classes, as the scope picker lists them.
      classes: Object.entries(demo.cls)
        .filter(([code]) => ["FLK", "CHP", "FCR"].includes(code))
        .map(([, id]) => id),
      specialist: demo.people.specialist!,
    };
    const a = startWorker(),
      b = startWorker();
    await untilReady([a, b], 120_000);
    for (const w of [a, b]) expect(w.log).toContain("run worker ready");
  }, 180_000);

  afterAll(async () => {
    for (const w of workers) await stopRunWorker(w);
    await mods?.runner.stopRunQueue();
    await mods?.client.closeDb();
    setup.stop();
  }, 60_000);

  it("shares the chunks, survives a worker killed mid-chunk, and gives one process's numbers", async () => {
    session.userId = d.specialist;
    const body = {
      scope: { trenchId: d.trenchId, contextIds: [d.ctx], classIds: d.classes },
      tests: [
        { kind: "l-envelope", statistic: "dclf" },
        { kind: "cross-l", a: d.classes[0], b: d.classes[1], null: "a-fixed" },
      ],
      params: { nsim: 1999, seed: 18, correction: "translation" },
    };
    const res = await call(mods.runsRoute, "POST", { siteId: d.siteId }, body);
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    const runId = res.json.id as string;
    await until("a worker to take the run", () => workers.some((w) => w.log.includes(`run ${runId} taken`)));
    const coordinator = workers.find((w) => w.log.includes(`run ${runId} taken`))!;
    const helper = workers.find((w) => w !== coordinator)!;
    // the helper takes a chunk of the coordinator's run; it is killed while simulating it
    await until("the other worker to take a chunk", () => /chunk \S+ taken/.test(helper.log));
    const gone = new Promise((r) => helper.proc.once("exit", r));
    helper.proc.kill("SIGKILL");
    await gone;
    const taken = [...helper.log.matchAll(/chunk (\S+) taken/g)].map((m) => m[1]);
    const lost = taken.filter((id) => !helper.log.includes(`chunk ${id} done`));
    expect(lost.length, helper.log).toBeGreaterThan(0);

    const db = await mods.client.getDb();
    const { analysisRuns } = mods.s;
    let row = (await db.select().from(analysisRuns).where(eq(analysisRuns.id, runId)))[0];
    for (let i = 0; i < 2400 && row.status !== "done"; i++) {
      if (row.status === "failed") throw new Error(`run failed: ${row.error}\n${coordinator.log}`);
      await new Promise((r) => setTimeout(r, 100));
      row = (await db.select().from(analysisRuns).where(eq(analysisRuns.id, runId)))[0];
    }
    expect(row.status, coordinator.log).toBe("done");
    // the chunk the killed worker held was computed again, by the coordinator
    const client = (db as unknown as { $client: pg.Pool }).$client;
    for (const id of lost) {
      const { rows } = await client.query("select state, retry_count from pgboss.job where id = $1", [id]);
      expect(rows[0]).toMatchObject({ state: "completed" });
      expect(rows[0].retry_count).toBeGreaterThanOrEqual(1);
      expect(coordinator.log).toContain(`chunk ${id} done`);
    }

    // The same run computed in one process (this one, no threads, no queue): the same numbers.
    const [copy] = await db
      .insert(analysisRuns)
      .values({
        siteId: row.siteId,
        trenchId: row.trenchId,
        scope: row.scope,
        method: row.method,
        params: row.params,
        seed: row.seed,
        engineVersion: row.engineVersion,
        fingerprint: row.fingerprint,
        createdBy: row.createdBy,
      })
      .returning();
    await mods.execute.executeRun(db, copy.id, { signal: new AbortController().signal, pool: null });
    const [single] = await db.select().from(analysisRuns).where(eq(analysisRuns.id, copy.id));
    expect(single.status).toBe("done");
    const shared = row.result as { results: unknown[] };
    const alone = single.result as { results: unknown[] };
    expect(alone.results.length).toBe(4);
    expect(shared.results).toEqual(alone.results);
  }, 300_000);
});
