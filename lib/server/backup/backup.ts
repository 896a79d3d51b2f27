import "server-only";
import { cp, mkdir, mkdtemp, rename, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import * as tar from "tar";
import { dumpPglite, dumpPostgres, type DatabaseSource } from "./database";
import {
  FILES,
  MANIFEST,
  ORIGINALS,
  PGLITE_DUMP,
  POSTGRES_DUMP,
  listFiles,
  sha256File,
  type BackupManifest,
} from "./manifest";
import { fetchOriginals, photosWithOriginals } from "./originals";

/**
 * One archive (gzipped tar) holding the whole database, the uploaded files store and every photo original
 * the database refers to (fetched from the upload service), with manifest.json listing every file's SHA-256
 * digest, the originals by photo, and the rows of every table. An original that cannot be fetched fails the
 * backup, naming the photo. The embedded database is dumped by PGlite
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
    let held: Awaited<ReturnType<typeof photosWithOriginals>>;
    if (opts.database.kind === "pglite") {
      held = await photosWithOriginals(opts.database.client);
      const dump = await dumpPglite(opts.database.client);
      await writeFile(path.join(work, PGLITE_DUMP), dump.bytes);
      rows = dump.rows;
    } else {
      const dump = await dumpPostgres(opts.database.url, path.join(work, POSTGRES_DUMP), photosWithOriginals);
      rows = dump.rows;
      held = dump.read;
    }
    const originals = await fetchOriginals(work, held.photos);
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
      originals,
      seededPhotos: held.seeded,
    };
    await writeFile(path.join(work, MANIFEST), `${JSON.stringify(manifest, null, 2)}\n`);
    await tar.c({ file: partial, gzip: true, cwd: work, portable: true }, [
      MANIFEST,
      "database",
      ...(stored.length ? [FILES] : []),
      ...(originals.length ? [ORIGINALS] : []),
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
