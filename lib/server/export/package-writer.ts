import "server-only";
import { createWriteStream } from "node:fs";
import { mkdir, rename, rm, stat } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { and, eq, inArray } from "drizzle-orm";
import type { Db } from "@/db/client";
import { depositionPackages, sites } from "@/db/schema";
import { isPublicError } from "@/lib/server/errors";
import { storePath } from "@/lib/server/uploads/file-store";
import { bagZip, type BagSummary } from "./bagit";
import { packageFiles, planPackage } from "./deposition";
import { prunePackages } from "./package-prune";

/** Progress is written at most this often (and once at the end): a row per photo would be needless churn. */
const PROGRESS_EVERY_MS = 250;

/** Where a package's zip lives in the file store (relative, as the row keeps it). */
export const packageFilePath = (siteId: string, packageId: string) =>
  path.posix.join("packages", siteId, `${packageId}.zip`);

/**
 * Writes one queued package to the file store as the job's work: the zip goes to disk chunk by chunk as
 * it is made (never whole in memory), under a temporary name until it is complete; the row carries files
 * done out of the total as it goes, and at the end the size and the fingerprint — or why it failed.
 */
export async function writePackage(db: Db, packageId: string, signal: AbortSignal): Promise<void> {
  const [claimed] = await db
    .update(depositionPackages)
    .set({ status: "running", startedAt: new Date() })
    .where(and(eq(depositionPackages.id, packageId), eq(depositionPackages.status, "queued")))
    .returning();
  if (!claimed) return;
  const relative = packageFilePath(claimed.siteId, claimed.id);
  const part = storePath(`${relative}.part`);
  try {
    const [site] = await db.select().from(sites).where(eq(sites.id, claimed.siteId));
    if (!site) throw new Error("the site is gone");
    const plan = await planPackage(db, site, claimed.createdBy ?? "", claimed.trenchId ?? undefined);
    const fileName = `${plan.root}.zip`;
    await db
      .update(depositionPackages)
      .set({ filesTotal: plan.entries.length, fileName })
      .where(eq(depositionPackages.id, packageId));

    let written = Promise.resolve();
    let last = 0;
    const progress = (done: number) => {
      const now = Date.now();
      if (now - last < PROGRESS_EVERY_MS) return;
      last = now;
      written = written.then(async () => {
        await db.update(depositionPackages).set({ filesDone: done }).where(eq(depositionPackages.id, packageId));
      });
    };
    let summary: BagSummary | undefined;
    async function* zip() {
      summary = yield* bagZip(plan.root, packageFiles(plan, progress), plan.info);
    }
    await mkdir(path.dirname(part), { recursive: true });
    await pipeline(Readable.from(zip()), createWriteStream(part), { signal });
    await written;
    if (!summary) throw new Error("the zip ended early");
    await rename(part, storePath(relative));
    const { size } = await stat(storePath(relative));
    await db
      .update(depositionPackages)
      .set({
        status: "done",
        filesDone: plan.entries.length,
        filePath: relative,
        bytes: size,
        fingerprint: summary.fingerprint,
        finishedAt: new Date(),
      })
      .where(eq(depositionPackages.id, packageId));
    // Older zips go once a newer one is complete; a failure to tidy up never fails the package just written.
    await prunePackages(db, claimed.siteId).catch((err) => console.error("[loamwork] package prune failed", err));
  } catch (err) {
    await rm(part, { force: true });
    if (!isPublicError(err)) console.error(`[loamwork] package ${packageId} failed`, err);
    const reason = isPublicError(err) ? err.message : "The package could not be written; start it again.";
    await db
      .update(depositionPackages)
      .set({ status: "failed", error: reason, finishedAt: new Date() })
      .where(eq(depositionPackages.id, packageId));
  }
}

/**
 * Packages a stopped process left queued or half-written: they are queued again (a half-written zip is
 * started afresh), oldest first.
 */
export async function requeuePackages(db: Db): Promise<string[]> {
  const rows = await db
    .update(depositionPackages)
    .set({ status: "queued", filesDone: 0, startedAt: null })
    .where(inArray(depositionPackages.status, ["queued", "running"]))
    .returning({ id: depositionPackages.id, createdAt: depositionPackages.createdAt });
  return rows.sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime()).map((r) => r.id);
}
