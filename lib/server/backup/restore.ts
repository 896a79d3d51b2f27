import "server-only";
import { cp, mkdtemp, readFile, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import * as tar from "tar";
import { assertFreshTarget, loadPglite, loadPostgres, type DatabaseTarget } from "./database";
import { assertOriginalsCanGoBack, forgetUploads, putOriginalsBack } from "./originals";
import {
  BackupRefused,
  FILES,
  MANIFEST,
  PGLITE_DUMP,
  POSTGRES_DUMP,
  listFiles,
  parseManifest,
  verifyUnpacked,
  type BackupManifest,
} from "./manifest";

const engineWords = { pglite: "the embedded database (PGlite)", postgresql: "a PostgreSQL server" } as const;

/**
 * Restores a backup made by makeBackup into a fresh install. Everything is checked before anything is
 * written: the archive unpacks, every file matches its digest in the manifest and none is extra, the
 * database engine is the one the backup was taken from, and the target database and files store are empty.
 * The photo originals then go back to the configured upload service (kept where it still holds them byte
 * for byte), the database is loaded with the photos' new keys in the same transaction, the files copied, and
 * every table's rows counted against the manifest.
 */
export async function restoreBackup(opts: { file: string; filesDir: string; database: DatabaseTarget }): Promise<{
  manifest: BackupManifest;
  rows: Record<string, number>;
  files: number;
  originals: { uploaded: number; kept: number };
}> {
  const work = await mkdtemp(path.join(os.tmpdir(), "loamwork-restore-"));
  try {
    try {
      await tar.x({ file: opts.file, cwd: work, strict: true });
    } catch (err) {
      throw new BackupRefused(
        `${opts.file} cannot be read as a Loamwork backup (${(err as Error).message}): the archive is damaged or not a backup. Nothing was restored.`,
      );
    }
    const text = await readFile(path.join(work, MANIFEST), "utf8").catch(() => {
      throw new BackupRefused(`${opts.file} has no manifest.json: it is not a Loamwork backup. Nothing was restored.`);
    });
    const manifest = parseManifest(text);
    await verifyUnpacked(work, manifest);
    if (manifest.engine !== opts.database.kind)
      throw new BackupRefused(
        `This backup holds ${engineWords[manifest.engine]}, but this install uses ${engineWords[opts.database.kind]}: ${
          manifest.engine === "pglite"
            ? "restore it with DATABASE_URL unset, into an empty LOAMWORK_DATA_DIR"
            : "restore it with DATABASE_URL set to an empty PostgreSQL database"
        }. Nothing was restored.`,
      );
    await assertFreshTarget(opts.database);
    if ((await listFiles(opts.filesDir)).length)
      throw new BackupRefused(
        `The files store ${opts.filesDir} is not empty: restore into a fresh install (an empty LOAMWORK_FILES_DIR). Nothing was restored.`,
      );

    assertOriginalsCanGoBack(manifest);

    const back = await putOriginalsBack(work, manifest.originals ?? []);
    let rows: Record<string, number>;
    try {
      rows =
        opts.database.kind === "pglite"
          ? await loadPglite(opts.database.dataDir, await readFile(path.join(work, PGLITE_DUMP)), back.rewrites)
          : await loadPostgres(opts.database.url, path.join(work, POSTGRES_DUMP), back.rewrites);
    } catch (err) {
      // The database was left as it was: the originals just sent would be nobody's.
      await forgetUploads(back.uploaded);
      throw err;
    }
    const packed = await listFiles(path.join(work, FILES));
    if (packed.length) await cp(path.join(work, FILES), opts.filesDir, { recursive: true });

    const differ = Object.entries(manifest.rows)
      .filter(([table, n]) => rows[table] !== n)
      .map(([table, n]) => `${table}: ${rows[table] ?? "missing"} rows restored, ${n} backed up`);
    if (differ.length) throw new Error(`The restored database differs from the backup: ${differ.join("; ")}.`);
    return {
      manifest,
      rows,
      files: packed.length,
      originals: { uploaded: back.uploaded.length, kept: back.kept },
    };
  } finally {
    await rm(work, { recursive: true, force: true });
  }
}
