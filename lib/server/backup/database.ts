import "server-only";
import { execFile, spawn } from "node:child_process";
import { appendFile, readdir, rm } from "node:fs/promises";
import path from "node:path";
import { promisify } from "node:util";
import type { PGlite } from "@electric-sql/pglite";
import pg from "pg";
import { BackupRefused } from "./manifest";
import { rewriteSql, type KeyRewrite } from "./originals";

const run = promisify(execFile);

/** Where a backup reads the database: the embedded one (already open in this process) or a server. */
export type DatabaseSource = { kind: "pglite"; client: PGlite } | { kind: "postgresql"; url: string };
/** Where a restore writes it: a fresh embedded data folder, or an empty database on a server. */
export type DatabaseTarget = { kind: "pglite"; dataDir: string } | { kind: "postgresql"; url: string };

export type Queryable = { query: (text: string) => Promise<{ rows: unknown[] }> };

const quote = (name: string) => `"${name.replace(/"/g, '""')}"`;

/** Rows of every table of the database ("schema.table" → count), outside PostgreSQL's own catalogues. */
export async function countRows(db: Queryable): Promise<Record<string, number>> {
  const { rows } = await db.query(
    `select table_schema as s, table_name as t from information_schema.tables
     where table_type = 'BASE TABLE' and table_schema not in ('pg_catalog', 'information_schema')
     order by 1, 2`,
  );
  const out: Record<string, number> = {};
  for (const { s, t } of rows as { s: string; t: string }[]) {
    const r = await db.query(`select count(*)::int as n from ${quote(s)}.${quote(t)}`);
    out[`${s}.${t}`] = (r.rows[0] as { n: number }).n;
  }
  return out;
}

/** The embedded database's data folder as a gzipped tarball (PGlite's own dump), and its rows. */
export async function dumpPglite(client: PGlite): Promise<{ bytes: Uint8Array; rows: Record<string, number> }> {
  const rows = await countRows(client);
  const blob = await client.dumpDataDir("gzip");
  return { bytes: new Uint8Array(await blob.arrayBuffer()), rows };
}

/**
 * pg_dump of the whole database (custom format, no owners or grants, so it restores under another role),
 * taken in the snapshot the rows were counted in: the counts describe exactly what the dump holds. `read`
 * runs in that snapshot too (the photos whose originals the backup fetches).
 */
export async function dumpPostgres<T>(
  url: string,
  outFile: string,
  read: (db: Queryable) => Promise<T>,
): Promise<{ rows: Record<string, number>; read: T }> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query("begin isolation level repeatable read read only");
    const { rows: snap } = await client.query<{ id: string }>("select pg_export_snapshot() as id");
    const rows = await countRows(client);
    const got = await read(client);
    await run(
      "pg_dump",
      ["--format=custom", "--no-owner", "--no-privileges", `--snapshot=${snap[0]!.id}`, `--file=${outFile}`, url],
      { maxBuffer: 16 * 1024 * 1024 },
    ).catch((err: Error & { stderr?: string }) => {
      throw new Error(`pg_dump failed: ${err.stderr?.trim() || err.message}`);
    });
    await client.query("commit");
    return { rows, read: got };
  } finally {
    await client.end();
  }
}

/** Refuses a target that is not fresh, before anything is written. */
export async function assertFreshTarget(target: DatabaseTarget): Promise<void> {
  if (target.kind === "pglite") {
    const entries = await readdir(target.dataDir).catch((err: NodeJS.ErrnoException) => {
      if (err.code === "ENOENT") return [];
      throw err;
    });
    if (entries.length)
      throw new BackupRefused(
        `The database folder ${target.dataDir} is not empty: restore into a fresh install (a new, empty LOAMWORK_DATA_DIR). Nothing was restored.`,
      );
    return;
  }
  const client = new pg.Client({ connectionString: target.url });
  await client.connect();
  try {
    const { rows } = await client.query<{ n: number }>(
      `select count(*)::int as n from information_schema.tables where table_schema = 'public' and table_name = 'users'`,
    );
    if (rows[0]!.n > 0) {
      const { rows: people } = await client.query<{ n: number }>(`select count(*)::int as n from public.users`);
      if (people[0]!.n > 0)
        throw new BackupRefused(
          `The database at DATABASE_URL already holds ${people[0]!.n} account(s): restore into a fresh install (an empty database). Nothing was restored.`,
        );
    }
  } finally {
    await client.end();
  }
}

/**
 * Writes the embedded database's data folder from its dump and rewrites the photos' keys at the upload
 * service in one transaction; returns its rows as restored. On any failure the folder is emptied again.
 */
export async function loadPglite(
  dataDir: string,
  bytes: Uint8Array,
  rewrites: KeyRewrite[] = [],
): Promise<Record<string, number>> {
  const { PGlite } = await import("@electric-sql/pglite");
  try {
    const client = new PGlite(dataDir, { loadDataDir: new Blob([bytes as Uint8Array<ArrayBuffer>]) });
    try {
      await client.waitReady;
      if (rewrites.length) await client.exec(`begin;\n${rewriteSql(rewrites)}\ncommit;`);
      return await countRows(client);
    } finally {
      await client.close();
    }
  } catch (err) {
    for (const entry of await readdir(dataDir).catch(() => []))
      await rm(path.join(dataDir, entry), { recursive: true });
    throw err;
  }
}

/** Runs a command, its output discarded, failing with what it wrote to stderr. */
function runQuiet(cmd: string, args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { stdio: ["ignore", "ignore", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (c: Buffer) => {
      if (stderr.length < 64 * 1024) stderr += c.toString("utf8");
    });
    child.on("error", reject);
    child.on("close", (code) =>
      code === 0 ? resolve() : reject(Object.assign(new Error(`${cmd} exited with ${code}`), { stderr })),
    );
  });
}

/**
 * Loads the dump into the target database in one transaction — pg_restore writes it out as SQL, the photos'
 * key rewrites follow it, and psql runs the whole in a single transaction that stops at the first error: a
 * failure leaves the database as it was. Objects a fresh install's first start may already have made (empty
 * tables, the migrations' record) are replaced.
 */
export async function loadPostgres(
  url: string,
  dumpFile: string,
  rewrites: KeyRewrite[] = [],
): Promise<Record<string, number>> {
  const script = `${dumpFile}.sql`;
  await run("pg_restore", ["--no-owner", "--no-privileges", "--clean", "--if-exists", `--file=${script}`, dumpFile], {
    maxBuffer: 16 * 1024 * 1024,
  }).catch((err: Error & { stderr?: string }) => {
    throw new Error(`pg_restore could not read the dump (nothing was written): ${err.stderr?.trim() || err.message}`);
  });
  try {
    if (rewrites.length) await appendFile(script, rewriteSql(rewrites));
    await runQuiet("psql", [
      "--no-psqlrc",
      "--quiet",
      "--single-transaction",
      "--set=ON_ERROR_STOP=1",
      `--file=${script}`,
      `--dbname=${url}`,
    ]).catch((err: Error & { stderr?: string }) => {
      throw new Error(`the restore failed (the database was left as it was): ${err.stderr?.trim() || err.message}`);
    });
  } finally {
    await rm(script, { force: true });
  }
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await countRows(client);
  } finally {
    await client.end();
  }
}
