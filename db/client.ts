import path from "node:path";
import { mkdirSync } from "node:fs";
import { PGlite } from "@electric-sql/pglite";
import { drizzle as drizzlePglite, type PgliteDatabase } from "drizzle-orm/pglite";
import { migrate as migratePglite } from "drizzle-orm/pglite/migrator";
import { drizzle as drizzlePg } from "drizzle-orm/node-postgres";
import { migrate as migratePg } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";
import { env } from "@/lib/env";
import * as schema from "./schema";

/** Both drivers expose the same query builder; the PGlite type is used as the common one. */
export type Db = PgliteDatabase<typeof schema>;
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

type Holder = { ready?: Promise<Db>; close?: () => Promise<void> };
const holder: Holder = ((globalThis as Record<string, unknown>).__loamworkDb ??= {}) as Holder;

const migrationsFolder = path.join(process.cwd(), "drizzle");

async function open(): Promise<Db> {
  const { DATABASE_URL, LOAMWORK_DATA_DIR } = env();
  if (DATABASE_URL) {
    const pool = new pg.Pool({ connectionString: DATABASE_URL, max: 10 });
    const db = drizzlePg(pool, { schema });
    await migratePg(db, { migrationsFolder });
    holder.close = () => pool.end();
    return db as unknown as Db;
  }
  // Exactly one process may open a PGlite folder (local-services.md); this module keeps one per process.
  let client: PGlite;
  if (LOAMWORK_DATA_DIR === "memory") {
    client = new PGlite();
  } else {
    mkdirSync(LOAMWORK_DATA_DIR, { recursive: true });
    client = new PGlite(LOAMWORK_DATA_DIR);
  }
  const db = drizzlePglite(client, { schema });
  await migratePglite(db, { migrationsFolder });
  holder.close = () => client.close();
  return db;
}

/** The one database of this process, migrated on first use. */
export function getDb(): Promise<Db> {
  holder.ready ??= open().catch((err) => {
    holder.ready = undefined;
    throw err;
  });
  return holder.ready;
}

export async function closeDb(): Promise<void> {
  const close = holder.close;
  holder.ready = undefined;
  holder.close = undefined;
  if (close) await close();
}

export { schema };
