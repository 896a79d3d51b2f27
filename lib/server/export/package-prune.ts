import "server-only";
import { rm } from "node:fs/promises";
import { and, desc, eq, isNotNull } from "drizzle-orm";
import type { Db } from "@/db/client";
import { depositionPackages } from "@/db/schema";
import { processSingleton } from "@/lib/process-singleton";
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

type Reading = { open: number; last: number };
const reading = processSingleton("package-downloads", () => new Map<string, Reading>());

/** A download of a package's zip began; call the answer when its stream closes. */
export function downloadStarted(packageId: string, now = Date.now()): () => void {
  const r = reading.get(packageId) ?? { open: 0, last: now };
  reading.set(packageId, { open: r.open + 1, last: now });
  let ended = false;
  return () => {
    if (ended) return;
    ended = true;
    const cur = reading.get(packageId);
    if (cur) reading.set(packageId, { open: Math.max(0, cur.open - 1), last: Date.now() });
  };
}

/** True while this process streams the package's zip, or streamed it within the resume grace. */
function beingDownloaded(packageId: string, now: number): boolean {
  const r = reading.get(packageId);
  return !!r && (r.open > 0 || now - r.last < RESUME_GRACE_MS);
}

/**
 * After a package finishes: in each scope of the site (the whole site; each trench), the finished packages
 * beyond the newest KEEP_PACKAGES lose their zip (the row stays, with its fingerprint, and says the file was
 * removed). A zip this process is sending, or sent
 * moments ago, is left for a later prune. Another server process's downloads cannot be seen from here.
 */
export async function prunePackages(db: Db, siteId: string, now = Date.now()): Promise<string[]> {
  const rows = await db
    .select({ id: depositionPackages.id, trenchId: depositionPackages.trenchId, filePath: depositionPackages.filePath })
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
    if (!row.filePath || beingDownloaded(row.id, now)) continue;
    // The row first: a download asked for from now on hears the file is gone rather than finding half of it.
    await db.update(depositionPackages).set({ filePath: null }).where(eq(depositionPackages.id, row.id));
    await rm(storePath(row.filePath), { force: true });
    pruned.push(row.id);
  }
  return pruned;
}
