import "server-only";
import { rm } from "node:fs/promises";
import { and, desc, eq, isNotNull, isNull, lt, or } from "drizzle-orm";
import type { Db } from "@/db/client";
import { depositionPackages, type DepositionPackage } from "@/db/schema";
import { storePath } from "@/lib/server/uploads/file-store";

/**
 * Finished packages whose zip is kept, per scope: the whole site, and each trench on its own. A package is
 * handed to a repository, and each zip holds every photo and scan of what it covers, so keeping every one
 * would fill the store season by season; the newest few still let a director download the last one again or
 * compare it with the one before. Scopes are counted apart so that a season of trench packages never pushes
 * out the last whole-site package, nor one trench's packages another's.
 */
export const KEEP_PACKAGES = 3;

/** A download that ended this recently may be resumed with a Range request, so its file stays a while. */
export const RESUME_GRACE_MS = 60 * 60 * 1000;

/**
 * A download of the package's zip begins (or ends): noted on its row, so that a prune on any server process,
 * not only the one streaming it, leaves the file for the resume grace. One statement reads the row and notes
 * the download, so a prune either removed the file before (the row says so) or sees the download.
 */
export async function recordDownload(
  db: Db,
  siteId: string,
  packageId: string,
  at = new Date(),
): Promise<DepositionPackage | undefined> {
  const [row] = await db
    .update(depositionPackages)
    .set({ downloadedAt: at })
    .where(and(eq(depositionPackages.siteId, siteId), eq(depositionPackages.id, packageId)))
    .returning();
  return row;
}

/**
 * While a download streams, note it again every quarter of the resume grace (and once more when it ends), so
 * that a download lasting longer than the grace is never taken for an old one by a prune on another process.
 */
export function keepNotingDownload(
  stream: { once(event: "close", listener: () => void): unknown },
  note: () => Promise<unknown>,
  everyMs = RESUME_GRACE_MS / 4,
): void {
  const noted = () => {
    note().catch((err) => console.error("[loamwork] could not note a package download", err));
  };
  const timer = setInterval(noted, everyMs);
  timer.unref?.();
  stream.once("close", () => {
    clearInterval(timer);
    noted();
  });
}

/** True when a download of the zip began or ended within the resume grace, on whichever process served it. */
function beingDownloaded(downloadedAt: Date | null, now: number): boolean {
  return downloadedAt !== null && now - downloadedAt.getTime() < RESUME_GRACE_MS;
}

/**
 * After a package finishes: in each scope of the site (the whole site; each trench), the finished packages
 * beyond the newest KEEP_PACKAGES lose their zip (the row stays, with its fingerprint, and says the file was
 * removed). A zip whose download began or ended within the resume grace, on any server process, is left
 * for a later prune.
 */
export async function prunePackages(db: Db, siteId: string, now = Date.now()): Promise<string[]> {
  const rows = await db
    .select({
      id: depositionPackages.id,
      trenchId: depositionPackages.trenchId,
      filePath: depositionPackages.filePath,
      downloadedAt: depositionPackages.downloadedAt,
    })
    .from(depositionPackages)
    .where(
      and(
        eq(depositionPackages.siteId, siteId),
        eq(depositionPackages.status, "done"),
        isNotNull(depositionPackages.filePath),
      ),
    )
    .orderBy(desc(depositionPackages.finishedAt), desc(depositionPackages.createdAt));
  const seen = new Map<string | null, number>();
  const pruned: string[] = [];
  for (const row of rows) {
    const newer = seen.get(row.trenchId) ?? 0;
    seen.set(row.trenchId, newer + 1);
    if (newer < KEEP_PACKAGES) continue;
    if (!row.filePath || beingDownloaded(row.downloadedAt, now)) continue;
    // The row first: a download asked for from now on hears the file is gone rather than finding half of it.
    // Only if no download was noted since the read above (by another process, say): then the file stays.
    const cleared = await db
      .update(depositionPackages)
      .set({ filePath: null })
      .where(
        and(
          eq(depositionPackages.id, row.id),
          or(
            isNull(depositionPackages.downloadedAt),
            lt(depositionPackages.downloadedAt, new Date(now - RESUME_GRACE_MS)),
          ),
        ),
      )
      .returning({ id: depositionPackages.id });
    if (!cleared.length) continue;
    await rm(storePath(row.filePath), { force: true });
    pruned.push(row.id);
  }
  return pruned;
}
