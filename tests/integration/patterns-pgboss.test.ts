/**
 * The PostgreSQL path of runs: the app sends a run to pg-boss and a separate worker process
 * (`npm run worker`, scripts/worker.ts) takes it, computes it and writes the result back; a cancel from
 * the app stops the worker's run. Needs PostgreSQL binaries: uses LOAMWORK_TEST_PG when the suite runs
 * beside a server (scripts/with-postgres.sh), otherwise starts a throwaway cluster on a loopback port.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { session, call } from "../support/harness";

const pgRoot = "/usr/lib/postgresql";
const pgBin = existsSync(pgRoot) ? readdirSync(pgRoot).map((v) => path.join(pgRoot, v, "bin")).find((b) => existsSync(path.join(b, "initdb"))) : undefined;
if (!pgBin && !process.env.LOAMWORK_TEST_PG) console.warn("patterns-pgboss: skipped — no PostgreSQL binaries under /usr/lib/postgresql and no LOAMWORK_TEST_PG.");

const asPg = (cmd: string[]) => (process.getuid?.() === 0 ? ["runuser", ["-u", "postgres", "--", ...cmd]] : [cmd[0], cmd.slice(1)]) as [string, string[]];
const freePort = () => new Promise<number>((resolve) => { const s = createServer().listen(0, "127.0.0.1", () => { const p = (s.address() as { port: number }).port; s.close(() => resolve(p)); }); });

let cluster: { dir: string; stop: () => void } | undefined;
let worker: ChildProcess | undefined;
let workerLog = "";

async function serverUrl(): Promise<string> {
  if (process.env.LOAMWORK_TEST_PG) return process.env.LOAMWORK_TEST_PG;
  const dir = mkdtempSync(path.join(tmpdir(), "loamwork-pgboss-"));
  // As root, initdb must run as postgres, which must own the folder.
  if (process.getuid?.() === 0) chownSync(dir, Number(spawnSync("id", ["-u", "postgres"], { encoding: "utf8" }).stdout), 0);
  const port = await freePort();
  const run = (cmd: string[]) => {
    const [c, a] = asPg(cmd);
    const r = spawnSync(c, a, { encoding: "utf8" });
    if (r.status !== 0) throw new Error(`${cmd[0]} failed: ${r.stderr}`);
  };
  run([path.join(pgBin!, "initdb"), "-D", `${dir}/data`, "-U", "loamwork", "--auth=trust", "-E", "UTF8"]);
  run([path.join(pgBin!, "pg_ctl"), "-D", `${dir}/data`, "-l", `${dir}/log`, "-o", `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c fsync=off`, "-w", "start"]);
  cluster = { dir, stop: () => { try { run([path.join(pgBin!, "pg_ctl"), "-D", `${dir}/data`, "-m", "fast", "-w", "stop"]); } finally { rmSync(dir, { recursive: true, force: true }); } } };
  return `postgres://loamwork@127.0.0.1:${port}/postgres`;
}

describe.skipIf(!pgBin && !process.env.LOAMWORK_TEST_PG)("runs through pg-boss and a separate worker process", () => {
  let d: { siteId: string; trenchId: string; ctx: string; flk: string; specialist: string };
  let mods: Awaited<ReturnType<typeof load>>;
  const load = async () => ({
    client: await import("@/db/client"),
    s: await import("@/db/schema"),
    seed: await import("@/db/seed-demo"),
    runner: await import("@/lib/server/jobs/runner"),
    runsRoute: await import("@/app/api/sites/[siteId]/runs/route"),
    runRoute: await import("@/app/api/sites/[siteId]/runs/[runId]/route"),
    cancelRoute: await import("@/app/api/sites/[siteId]/runs/[runId]/cancel/route"),
  });

  beforeAll(async () => {
    const base = await serverUrl();
    const name = `lw_pgboss_${process.pid}`;
    const admin = new pg.Client({ connectionString: base });
    await admin.connect();
    await admin.query(`drop database if exists ${name}`);
    await admin.query(`create database ${name}`);
    await admin.end();
    const url = new URL(base);
    url.pathname = `/${name}`;
    process.env.DATABASE_URL = url.toString();
    process.env.LOAMWORK_RUN_QUEUE = "pg-boss";
    mods = await load();
    const db = await mods.client.getDb();
    const { siteId } = await mods.seed.seedDemo(db);
    const { s } = mods;
    const [trench] = await db.select().from(s.trenches).where(and(eq(s.trenches.siteId, siteId), eq(s.trenches.code, "A")));
    const [ctx] = await db.select().from(s.contexts).where(and(eq(s.contexts.trenchId, trench.id), eq(s.contexts.number, 1005)));
    const [flk] = await db.select().from(s.artefactClasses).where(and(eq(s.artefactClasses.siteId, siteId), eq(s.artefactClasses.code, "FLK")));
    const [spec] = await db.select().from(s.users).where(eq(s.users.email, "specialist@loamwork.test"));
    d = { siteId, trenchId: trench.id, ctx: ctx.id, flk: flk.id, specialist: spec.id };
    // The worker is its own process, started as `npm run worker` starts it.
    worker = spawn(process.execPath, [path.resolve("node_modules/tsx/dist/cli.mjs"), "--conditions=react-server", "scripts/worker.ts"], {
      env: { ...process.env, NODE_ENV: "production", DATABASE_URL: process.env.DATABASE_URL, LOAMWORK_DATA_DIR: "unused" },
      stdio: ["ignore", "pipe", "pipe"],
    });
    worker.stdout!.on("data", (b) => (workerLog += b));
    worker.stderr!.on("data", (b) => (workerLog += b));
    for (let i = 0; i < 600 && !workerLog.includes("run worker ready"); i++) {
      if (worker.exitCode !== null) throw new Error(`the worker exited:\n${workerLog}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(workerLog).toContain("run worker ready");
  }, 120_000);

  afterAll(async () => {
    if (worker && worker.exitCode === null) {
      const gone = new Promise((r) => worker!.once("exit", r));
      worker.kill("SIGTERM");
      await gone;
    }
    await mods?.runner.stopRunner();
    await mods?.client.closeDb();
    cluster?.stop();
  }, 60_000);

  const waitFor = async (runId: string, want: (row: { status: string; progress: number }) => boolean) => {
    const db = await mods.client.getDb();
    for (let i = 0; i < 1200; i++) {
      const [row] = await db.select().from(mods.s.analysisRuns).where(eq(mods.s.analysisRuns.id, runId));
      if (want(row)) return row;
      if (row.status === "failed") throw new Error(`run failed: ${row.error}\n${workerLog}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error(`the run never reached the wanted state\n${workerLog}`);
  };

  it("the app only queues the run; the worker process computes it (FLK clustered)", async () => {
    session.userId = d.specialist;
    const res = await call(mods.runsRoute, "POST", { siteId: d.siteId }, { scope: { trenchId: d.trenchId, contextIds: [d.ctx], classIds: [d.flk] }, tests: [{ kind: "l-csr" }], params: { nsim: 99, seed: 3 } });
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    expect(res.json.status).toBe("queued");
    await waitFor(res.json.id, (r) => r.status === "done");
    const read = await call(mods.runRoute, "GET", { siteId: d.siteId, runId: res.json.id });
    expect(read.json.progress).toBe(1);
    expect(read.json.result.tests[0].verdict).toBe("clustered");
    expect(read.json.outOfDate).toBe(false);
  }, 120_000);

  it("a cancel from the app stops the run in the worker", async () => {
    session.userId = d.specialist;
    const res = await call(mods.runsRoute, "POST", { siteId: d.siteId }, { scope: { trenchId: d.trenchId, contextIds: [d.ctx], classIds: [d.flk] }, tests: [{ kind: "l-csr" }], params: { nsim: 9999, seed: 4 } });
    await waitFor(res.json.id, (r) => r.status === "running" && r.progress > 0);
    expect((await call(mods.cancelRoute, "POST", { siteId: d.siteId, runId: res.json.id })).status).toBe(200);
    // The worker's job ends (pg-boss marks it completed) without writing a result.
    const db = await mods.client.getDb();
    for (let i = 0; ; i++) {
      const { rows } = await (db as unknown as { $client: pg.Pool }).$client.query("select state from pgboss.job where data->>'runId' = $1", [res.json.id]);
      if (rows[0]?.state === "completed") break;
      if (i > 600) throw new Error(`the worker did not stop the run\n${workerLog}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    const read = await call(mods.runRoute, "GET", { siteId: d.siteId, runId: res.json.id });
    expect(read.json.status).toBe("cancelled");
    expect(read.json.result).toBeNull();
  }, 120_000);
});
