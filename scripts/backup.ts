import { existsSync } from "node:fs";
import path from "node:path";
import { closeDb, embeddedClient } from "@/db/client";
import { env } from "@/lib/env";
import { makeBackup } from "@/lib/server/backup/backup";

/**
 * `npm run backup -- FILE` (after `npm run build`, which compiles it to dist/backup.mjs): the whole database,
 * the uploaded files store and every photo original (fetched from the upload service the UPLOADTHING_*
 * settings name) in one archive with a manifest of SHA-256 digests. With the embedded database
 * stop the server first: only one process may open its data folder.
 */
const file = process.argv[2];
if (!file) {
  console.error("Usage: npm run backup -- FILE   (for example: npm run backup -- loamwork-2026-07-14.tar.gz)");
  process.exit(2);
}
const target = path.resolve(file);
if (existsSync(target)) {
  console.error(`${target} already exists: choose another name, so no earlier backup is overwritten.`);
  process.exit(1);
}
const { DATABASE_URL, LOAMWORK_DATA_DIR, LOAMWORK_FILES_DIR } = env();
try {
  let manifest;
  if (DATABASE_URL) {
    manifest = await makeBackup({
      file: target,
      filesDir: LOAMWORK_FILES_DIR,
      database: { kind: "postgresql", url: DATABASE_URL },
    });
  } else {
    if (LOAMWORK_DATA_DIR === "memory" || !existsSync(LOAMWORK_DATA_DIR)) {
      console.error(`There is no database folder at ${LOAMWORK_DATA_DIR} (LOAMWORK_DATA_DIR) to back up.`);
      process.exit(1);
    }
    const client = await embeddedClient();
    if (!client) throw new Error("the embedded database did not open");
    manifest = await makeBackup({
      file: target,
      filesDir: LOAMWORK_FILES_DIR,
      database: { kind: "pglite", client },
    });
    await closeDb();
  }
  const rows = Object.values(manifest.rows).reduce((a, b) => a + b, 0);
  const files = manifest.files.filter((f) => f.path.startsWith("files/")).length;
  console.log(`Backup written to ${target}`);
  console.log(`  database: ${manifest.engine}, ${Object.keys(manifest.rows).length} tables, ${rows} rows`);
  console.log(`  files: ${files} from ${path.resolve(LOAMWORK_FILES_DIR)}`);
  const originals = manifest.originals ?? [];
  const megabytes = (originals.reduce((a, o) => a + o.bytes, 0) / 1048576).toFixed(1);
  const seeded = manifest.seededPhotos
    ? ` (and ${manifest.seededPhotos} photo(s) the demo seed made, which have none)`
    : "";
  console.log(`  photo originals: ${originals.length} from the upload service, ${megabytes} MB${seeded}`);
} catch (err) {
  await closeDb().catch(() => undefined);
  console.error(`Backup failed: ${(err as Error).message}`);
  process.exit(1);
}
