/**
 * A PostgreSQL database for a test file that needs the real server (pg-boss, several worker processes):
 * the one the suite gives the file (scripts/with-postgres.sh sets DATABASE_URL), or else a throwaway
 * cluster on a free loopback port, stopped and removed by `stop`. `available` is false only when there is
 * neither a given server nor PostgreSQL binaries under /usr/lib/postgresql. Called from `vi.hoisted`, so
 * DATABASE_URL is set before any module reads the environment (lib/env caches it).
 */
import { spawnSync } from "node:child_process";
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

export type ThrowawayPostgres = { available: boolean; stop: () => void };

/** `name` names the temporary folder and the database (loamwork_<name>). */
export function throwawayPostgres(name: string): ThrowawayPostgres {
  const root = "/usr/lib/postgresql";
  const bin = existsSync(root)
    ? readdirSync(root)
        .map((v) => path.join(root, v, "bin"))
        .find((b) => existsSync(path.join(b, "initdb")))
    : undefined;
  if (process.env.DATABASE_URL || !bin) return { available: !!process.env.DATABASE_URL, stop: () => {} };
  const dir = mkdtempSync(path.join(tmpdir(), `loamwork-${name}-`));
  const asRoot = process.getuid?.() === 0;
  // As root, the server must run as postgres, which must own the folder.
  if (asRoot) chownSync(dir, Number(spawnSync("id", ["-u", "postgres"], { encoding: "utf8" }).stdout), 0);
  const run = ([cmd, ...args]: [string, ...string[]]) => {
    const r = asRoot
      ? spawnSync("runuser", ["-u", "postgres", "--", cmd, ...args], { encoding: "utf8" })
      : spawnSync(cmd, args, { encoding: "utf8" });
    if (r.status !== 0) throw new Error(`${cmd} failed: ${r.stderr}`);
  };
  const port = Number(
    spawnSync(
      process.execPath,
      [
        "-e",
        "const s=require('net').createServer().listen(0,'127.0.0.1',()=>{process.stdout.write(String(s.address().port));s.close()})",
      ],
      { encoding: "utf8" },
    ).stdout,
  );
  run([path.join(bin, "initdb"), "-D", `${dir}/data`, "-U", "loamwork", "--auth=trust", "-E", "UTF8"]);
  run([
    path.join(bin, "pg_ctl"),
    "-D",
    `${dir}/data`,
    "-l",
    `${dir}/log`,
    "-o",
    `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c fsync=off`,
    "-w",
    "start",
  ]);
  run([path.join(bin, "createdb"), "-h", "127.0.0.1", "-p", String(port), "-U", "loamwork", `loamwork_${name}`]);
  process.env.DATABASE_URL = `postgres://loamwork@127.0.0.1:${port}/loamwork_${name}`;
  return {
    available: true,
    stop: () => {
      try {
        run([path.join(bin, "pg_ctl"), "-D", `${dir}/data`, "-m", "fast", "-w", "stop"]);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}
