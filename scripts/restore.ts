import { existsSync } from "node:fs";
import path from "node:path";
import { env } from "@/lib/env";
import { restoreBackup } from "@/lib/server/backup/restore";
import { BackupRefused } from "@/lib/server/backup/manifest";

/**
 * `npm run restore -- FILE` (after `npm run build`, which compiles it to dist/restore.mjs): brings a backup
 * made by `npm run backup` back into a fresh install — the database named by DATABASE_URL or
 * LOAMWORK_DATA_DIR, and the files store LOAMWORK_FILES_DIR, both empty — and the photo originals back to the
 * upload service the UPLOADTHING_* settings name. A damaged archive is refused before anything is written.
 */
const file = process.argv[2];
if (!file) {
  console.error("Usage: npm run restore -- FILE");
  process.exit(2);
}
const source = path.resolve(file);
if (!existsSync(source)) {
  console.error(`There is no backup at ${source}.`);
  process.exit(1);
}
const { DATABASE_URL, LOAMWORK_DATA_DIR, LOAMWORK_FILES_DIR } = env();
if (!DATABASE_URL && LOAMWORK_DATA_DIR === "memory") {
  console.error("LOAMWORK_DATA_DIR is 'memory': set it to the folder the restored database should live in.");
  process.exit(1);
}
try {
  const { manifest, rows, files, originals } = await restoreBackup({
    file: source,
    filesDir: LOAMWORK_FILES_DIR,
    database: DATABASE_URL ? { kind: "postgresql", url: DATABASE_URL } : { kind: "pglite", dataDir: LOAMWORK_DATA_DIR },
  });
  const total = Object.values(rows).reduce((a, b) => a + b, 0);
  console.log(`Restored the backup of ${manifest.createdAt} from ${source}`);
  console.log(`  database: ${manifest.engine}, ${Object.keys(rows).length} tables, ${total} rows, as backed up`);
  console.log(`  files: ${files} into ${path.resolve(LOAMWORK_FILES_DIR)}`);
  console.log(
    `  photo originals: ${originals.uploaded} sent to the upload service, ${originals.kept} already there unchanged`,
  );
} catch (err) {
  console.error(err instanceof BackupRefused ? err.message : `Restore failed: ${(err as Error).message}`);
  process.exit(1);
}
