import { mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";

/** Every test file stores photos and mail in a fresh temporary folder, never in the working tree. */
process.env.LOAMWORK_FILES_DIR = mkdtempSync(path.join(os.tmpdir(), "loamwork-files-"));
process.env.MAIL_SINK_DIR = mkdtempSync(path.join(os.tmpdir(), "loamwork-mail-"));

/**
 * When the suite runs against a real PostgreSQL server (LOAMWORK_TEST_PG, set by scripts/with-postgres.sh),
 * every test file gets a database of its own, so migrations and rows of parallel files never meet.
 */
const base = process.env.LOAMWORK_TEST_PG;
if (base) {
  const name = `lw_${process.pid}_${Math.random().toString(36).slice(2, 8)}`;
  const admin = new pg.Client({ connectionString: base });
  await admin.connect();
  await admin.query(`create database ${name}`);
  await admin.end();
  const url = new URL(base);
  url.pathname = `/${name}`;
  process.env.DATABASE_URL = url.toString();
}
