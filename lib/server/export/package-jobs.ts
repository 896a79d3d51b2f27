import "server-only";
import { createReadStream } from "node:fs";
import { stat } from "node:fs/promises";
import { Readable } from "node:stream";
import { and, desc, eq } from "drizzle-orm";
import type { Db } from "@/db/client";
import { depositionPackages, trenches, type DepositionPackage } from "@/db/schema";
import { recordAudit } from "@/lib/server/audit";
import { conflict, notFound } from "@/lib/server/errors";
import type { SiteActor } from "@/lib/server/membership";
import { userNames } from "@/lib/server/reads/user-names";
import { storePath } from "@/lib/server/uploads/file-store";
import { written } from "@/lib/server/written";
import { packageQueue } from "@/lib/server/jobs/package-queue";
import { packageTrenchCode } from "./deposition";
import { KEEP_PACKAGES, keepNotingDownload, recordDownload } from "./package-prune";

/** A package job as the screen and scripts see it. */
export type PackageView = {
  id: string;
  trench: string | null;
  status: DepositionPackage["status"];
  filesDone: number;
  filesTotal: number;
  fileName: string | null;
  bytes: number | null;
  fingerprint: string | null;
  /** False once a finished package's zip was removed to make room (only the newest few per scope are kept). */
  fileKept: boolean;
  error: string | null;
  createdBy: string;
  createdAt: Date;
  finishedAt: Date | null;
};

async function views(db: Db, rows: { p: DepositionPackage; trench: string | null }[]): Promise<PackageView[]> {
  const names = await userNames(
    db,
    rows.map((r) => r.p.createdBy),
  );
  return rows.map(({ p, trench }) => ({
    id: p.id,
    trench,
    status: p.status,
    filesDone: p.filesDone,
    filesTotal: p.filesTotal,
    fileName: p.fileName,
    bytes: p.bytes,
    fingerprint: p.fingerprint,
    fileKept: p.filePath !== null,
    error: p.error,
    createdBy: p.createdBy ? (names.get(p.createdBy) ?? "") : "",
    createdAt: p.createdAt,
    finishedAt: p.finishedAt,
  }));
}

const withTrench = (db: Db) =>
  db
    .select({ p: depositionPackages, trench: trenches.code })
    .from(depositionPackages)
    .leftJoin(trenches, eq(trenches.id, depositionPackages.trenchId))
    .$dynamic();

/**
 * Starts a deposition package of the whole site or of one signed-off trench as a job: the row is written
 * and audited in one transaction, then the job is queued; the answer comes at once, with no file yet.
 */
export async function startPackage(db: Db, actor: SiteActor, input: { trenchId?: string }): Promise<PackageView> {
  const queue = await packageQueue();
  const trench = await packageTrenchCode(db, actor.site, input.trenchId);
  const row = await db.transaction(async (tx) => {
    const created = written(
      await tx
        .insert(depositionPackages)
        .values({ siteId: actor.site.id, trenchId: input.trenchId ?? null, createdBy: actor.userId })
        .returning(),
      "The new package",
    );
    await recordAudit(tx, {
      siteId: actor.site.id,
      actorId: actor.userId,
      action: "create",
      recordType: "package",
      recordId: created.id,
      after: { trench: trench ?? "all" },
    });
    return created;
  });
  queue.submit(row.id);
  return (await views(db, [{ p: row, trench }]))[0]!;
}

export async function readPackage(db: Db, actor: SiteActor, packageId: string): Promise<PackageView> {
  const rows = await withTrench(db).where(
    and(eq(depositionPackages.siteId, actor.site.id), eq(depositionPackages.id, packageId)),
  );
  if (!rows.length) throw notFound("That package");
  return (await views(db, rows))[0]!;
}

/** The site's packages, newest first (the last 20: older ones are superseded). */
export async function listPackages(db: Db, actor: SiteActor): Promise<PackageView[]> {
  const rows = await withTrench(db)
    .where(eq(depositionPackages.siteId, actor.site.id))
    .orderBy(desc(depositionPackages.createdAt))
    .limit(20);
  return views(db, rows);
}

/** "bytes=a-b", "bytes=a-" or "bytes=-n" (RFC 9110 §14.1.2), one range only; null = the whole file. */
export function parseRange(header: string | null, size: number): { start: number; end: number } | null | "bad" {
  if (!header) return null;
  const m = /^bytes=(\d*)-(\d*)$/.exec(header.trim());
  if (!m || (m[1] === "" && m[2] === "")) return "bad";
  if (m[1] === "") {
    const n = Number(m[2]);
    if (n === 0) return "bad";
    return { start: Math.max(0, size - n), end: size - 1 };
  }
  const start = Number(m[1]);
  const end = m[2] === "" ? size - 1 : Math.min(Number(m[2]), size - 1);
  if (start >= size || end < start) return "bad";
  return { start, end };
}

/** The finished package's zip, streamed from disk; a Range request gets that part (206). */
export async function packageFile(db: Db, actor: SiteActor, packageId: string, req: Request): Promise<Response> {
  // Noted before the file is looked at, so a prune on any process leaves it while it streams and after.
  const row = await recordDownload(db, actor.site.id, packageId);
  if (!row) throw notFound("That package");
  if (row.status === "done" && !row.filePath)
    throw conflict(
      `This package's file was removed when newer ones were written: the newest ${KEEP_PACKAGES} packages of the whole site and of each trench are kept. Its fingerprint stays in the list; write a new package to download one.`,
    );
  if (row.status !== "done" || !row.filePath)
    throw conflict(
      `This package is ${row.status === "failed" ? "failed" : "not written yet"}; there is no file to download.`,
    );
  const full = storePath(row.filePath);
  const size = (await stat(full).catch(() => null))?.size;
  if (size === undefined) throw notFound("That package's file");
  const headers: Record<string, string> = {
    "content-type": "application/zip",
    "content-disposition": `attachment; filename="${row.fileName ?? `${row.id}.zip`}"`,
    "cache-control": "no-store",
    "x-content-type-options": "nosniff",
    "accept-ranges": "bytes",
  };
  const range = parseRange(req.headers.get("range"), size);
  if (range === "bad")
    return new Response(null, { status: 416, headers: { ...headers, "content-range": `bytes */${size}` } });
  const { start, end } = range ?? { start: 0, end: size - 1 };
  const stream = createReadStream(full, { start, end });
  // Noted again while it streams, and at its end: the file stays a while after, for a download resumed with a
  // Range request.
  keepNotingDownload(stream, () => recordDownload(db, actor.site.id, row.id));
  const body = Readable.toWeb(stream) as ReadableStream<Uint8Array>;
  return new Response(body, {
    status: range ? 206 : 200,
    headers: {
      ...headers,
      "content-length": String(end - start + 1),
      ...(range ? { "content-range": `bytes ${start}-${end}/${size}` } : {}),
    },
  });
}
