import path from "node:path";
import { mkdirSync } from "node:fs";
import { PGlite } from "@electric-sql/pglite";
import { drizzle as drizzlePglite, type PgliteDatabase } from "drizzle-orm/pglite";
import { migrate as migratePglite } from "drizzle-orm/pglite/migrator";
import { drizzle as drizzlePg } from "drizzle-orm/node-postgres";
import { migrate as migratePg } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";
import createSubscriber from "pg-listen";
import { env } from "@/lib/env";
import { processSingleton } from "@/lib/process-singleton";
import * as schema from "./schema";

/** Both drivers expose the same query builder; the PGlite type is used as the common one. */
export type Db = PgliteDatabase<typeof schema>;
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

type Listen = (
  channel: string,
  onPayload: (payload: string) => void,
  onReconnect: () => void,
) => Promise<() => Promise<void>>;
type Holder = { ready?: Promise<Db>; close?: () => Promise<void>; listen?: Listen; pglite?: PGlite };
const holder = processSingleton<Holder>("database", () => ({}));

const migrationsFolder = path.join(process.cwd(), "drizzle");

async function open(): Promise<Db> {
  const { DATABASE_URL, LOAMWORK_DATA_DIR } = env();
  if (DATABASE_URL) {
    const pool = new pg.Pool({ connectionString: DATABASE_URL, max: 10 });
    const db = drizzlePg(pool, { schema });
    await migratePg(db, { migrationsFolder });
    // LISTEN needs a session of its own that outlives any query: one connection per listen, outside the pool,
    // which reconnects and listens again after a dropped connection.
    const subscribers = new Set<ReturnType<typeof createSubscriber>>();
    holder.listen = async (channel, onPayload, onReconnect) => {
      const subscriber = createSubscriber(
        { connectionString: DATABASE_URL },
        {
          parse: (text) => text,
          retryTimeout: Number.MAX_SAFE_INTEGER,
          retryInterval: (n) => Math.min(5000, 250 * 2 ** n),
        },
      );
      subscriber.notifications.on(channel, onPayload);
      subscriber.events.on("error", (err) => console.error(`[loamwork] listening on ${channel} failed`, err));
      try {
        await subscriber.connect();
        await subscriber.listenTo(channel);
      } catch (err) {
        await subscriber.close().catch(() => undefined);
        throw err;
      }
      subscriber.events.on("connected", onReconnect); // from now on: each reconnection, channel listened to again
      subscribers.add(subscriber);
      return async () => {
        subscribers.delete(subscriber);
        await subscriber.close();
      };
    };
    holder.close = async () => {
      await Promise.all([...subscribers].map((s) => s.close()));
      await pool.end();
    };
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
  holder.listen = (channel, onPayload) => client.listen(channel, onPayload);
  holder.pglite = client;
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

/**
 * Calls `onPayload` with each notification on `channel` (LISTEN/NOTIFY) from any session of the database,
 * delivered when the notifying transaction commits; returns the function that stops listening. On a
 * PostgreSQL server a dropped connection is reopened and `onReconnect` called: what was sent meanwhile is
 * lost, so the listener reads again whatever it follows.
 */
export async function listen(
  channel: string,
  onPayload: (payload: string) => void,
  onReconnect: () => void = () => {},
): Promise<() => Promise<void>> {
  await getDb();
  if (!holder.listen) throw new Error("The database was closed while a listener was starting.");
  return holder.listen(channel, onPayload, onReconnect);
}

/** The embedded database's own client (backups dump its data folder through it); null on a PostgreSQL server. */
export async function embeddedClient(): Promise<PGlite | null> {
  await getDb();
  return holder.pglite ?? null;
}

export async function closeDb(): Promise<void> {
  const close = holder.close;
  holder.ready = undefined;
  holder.close = undefined;
  holder.listen = undefined;
  holder.pglite = undefined;
  if (close) await close();
}

export { schema };
