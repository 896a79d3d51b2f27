import { openDB, type DBSchema, type IDBPDatabase } from "idb";
import type { ApiName } from "@/lib/api/catalog";

/**
 * One user's outbox on this device, in IndexedDB through `idb`: the writes made while the server was out of
 * reach, each the same request the online app would send plus the idempotency key made here and the version
 * of the record it was made on. One database per user, so diggers sharing a tablet never send each
 * other's work; signing out leaves it (unsent work is never thrown away without being asked).
 */
export type OutboxState = "waiting" | "attention";

/** Why the server refused a write: its reason code (`locked`, `stale`, …) and its own words. */
export type Refusal = { code: string | null; message: string; status: number; details?: unknown };

export type OutboxEntry = {
  seq?: number;
  /** The idempotency key, a UUID made on this device: the server answers its replay with the first answer. */
  key: string;
  siteId: string;
  operation: ApiName | UploadOperation;
  method: string;
  url: string;
  headers: Record<string, string>;
  body?: string;
  /** For a create: the id the device gave the record until the server's id is known. */
  localId?: string;
  /** For an edit or delete: the version of the record the change was made on. */
  baseVersion?: number | null;
  /** For an upload (a photo taken on the device): the file itself, kept as a Blob until it is sent. */
  file?: Blob;
  fileName?: string;
  /** What a person reads: "find #1234 in context 1005". */
  label: string;
  state: OutboxState;
  attempts: number;
  refusal?: Refusal;
  createdAt: string;
};

/** An upload kept in the outbox: its route's slug (the upload's input is the entry's body, as JSON). */
export type UploadOperation = "upload:recordPhoto";

/** A block of numbers reserved for this device and user by the server. */
export type HeldBlock = {
  id: string;
  siteId: string;
  kind: "find" | "context";
  first: number;
  last: number;
  /** Numbers of the block this device has written on a record (sent or not). */
  used: number[];
};

export type IdLink = { localId: string; serverId: string };

interface OutboxSchema extends DBSchema {
  entries: { key: number; value: OutboxEntry; indexes: { byKey: string } };
  ids: { key: string; value: IdLink };
  blocks: { key: string; value: HeldBlock };
  meta: { key: string; value: { key: string; value: unknown } };
}

export type OutboxDb = IDBPDatabase<OutboxSchema>;

export const outboxDbName = (userId: string) => `loamwork-outbox-${userId}`;

const open = new Map<string, Promise<OutboxDb>>();

/** The user's outbox database, opened once per page. */
export function openOutboxDb(userId: string): Promise<OutboxDb> {
  let db = open.get(userId);
  if (!db) {
    db = openDB<OutboxSchema>(outboxDbName(userId), 1, {
      upgrade(d) {
        const entries = d.createObjectStore("entries", { keyPath: "seq", autoIncrement: true });
        entries.createIndex("byKey", "key", { unique: true });
        d.createObjectStore("ids", { keyPath: "localId" });
        d.createObjectStore("blocks", { keyPath: "id" });
        d.createObjectStore("meta", { keyPath: "key" });
      },
    });
    open.set(userId, db);
  }
  return db;
}

/** Forgets the open handle (tests, and a user switch on a shared tablet). */
export async function closeOutboxDb(userId: string): Promise<void> {
  const db = open.get(userId);
  open.delete(userId);
  (await db)?.close();
}
