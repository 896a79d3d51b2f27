import "server-only";
import { cp, mkdir, mkdtemp, rename, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import * as tar from "tar";
import { dumpPglite, dumpPostgres, type DatabaseSource } from "./database";
import { FILES, MANIFEST, PGLITE_DUMP, POSTGRES_DUMP, listFiles, sha256File, type BackupManifest } from "./manifest";

/**
 * One archive (gzipped tar) holding the whole database and the uploaded files store, with manifest.json
 * listing every file's SHA-256 digest and the rows of every table. The embedded database is dumped by PGlite
 * itself (its data folder, taken while this process alone has it open); a PostgreSQL server by pg_dump.
 * The archive is written beside its final name and renamed when complete, so a failed backup leaves no
 * half-written file under that name.
 */
export async function makeBackup(opts: {
  file: string;
  filesDir: string;
  database: DatabaseSource;
}): Promise<BackupManifest> {
  const work = await mkdtemp(path.join(os.tmpdir(), "loamwork-backup-"));
  const partial = `${opts.file}.partial`;
  try {
    await mkdir(path.join(work, "database"));
    let rows: Record<string, number>;
    if (opts.database.kind === "pglite") {
      const dump = await dumpPglite(opts.database.client);
      await writeFile(path.join(work, PGLITE_DUMP), dump.bytes);
      rows = dump.rows;
    } else {
      rows = (await dumpPostgres(opts.database.url, path.join(work, POSTGRES_DUMP))).rows;
    }
    const stored = await listFiles(opts.filesDir);
    if (stored.length) await cp(opts.filesDir, path.join(work, FILES), { recursive: true });
    const files: BackupManifest["files"] = [];
    for (const p of await listFiles(work)) files.push({ path: p, ...(await sha256File(path.join(work, p))) });
    const manifest: BackupManifest = {
      format: "loamwork-backup",
      version: 1,
      createdAt: new Date().toISOString(),
      engine: opts.database.kind,
      rows,
      files,
    };
    await writeFile(path.join(work, MANIFEST), `${JSON.stringify(manifest, null, 2)}\n`);
    await tar.c({ file: partial, gzip: true, cwd: work, portable: true }, [
      MANIFEST,
      "database",
      ...(stored.length ? [FILES] : []),
    ]);
    await rename(partial, opts.file);
    return manifest;
  } catch (err) {
    await rm(partial, { force: true });
    throw err;
  } finally {
    await rm(work, { recursive: true, force: true });
  }
}
