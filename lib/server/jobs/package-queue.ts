import "server-only";
import { getDb } from "@/db/client";
import { processSingleton } from "@/lib/process-singleton";
import { requeuePackages, writePackage } from "../export/package-writer";
import { LocalRunQueue } from "./in-process-queue";

/**
 * Where deposition packages are written: the in-process queue the analysis runs use with the embedded
 * database, one package at a time, whichever database is in use. Not the pg-boss adapter: a package is
 * written to this server's file store and downloaded from it, which worker processes on other machines
 * do not share; and it is disk work, not computation worth spreading.
 */
const holder = processSingleton<{ ready?: Promise<LocalRunQueue> }>("package-queue", () => ({}));

async function start(): Promise<LocalRunQueue> {
  const db = await getDb();
  const queue = new LocalRunQueue((packageId, signal) => writePackage(db, packageId, signal));
  for (const id of await requeuePackages(db)) queue.submit(id);
  return queue;
}

/** This process's package queue, started on first use (left-behind packages are queued again then). */
export function packageQueue(): Promise<LocalRunQueue> {
  holder.ready ??= start().catch((err) => {
    holder.ready = undefined;
    throw err;
  });
  return holder.ready;
}

/** Resolves when no package is queued or being written here (tests, benchmarks). */
export async function packagesIdle(): Promise<void> {
  await (await packageQueue()).idle();
}
