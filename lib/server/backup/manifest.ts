import "server-only";
import { createHash } from "node:crypto";
import { createReadStream } from "node:fs";
import { readdir } from "node:fs/promises";
import path from "node:path";

/** What a backup archive says about itself (manifest.json at its root). */
export type BackupManifest = {
  format: "loamwork-backup";
  version: 1;
  createdAt: string;
  /** The database the backup was taken from: the embedded one's data folder, or a PostgreSQL dump. */
  engine: "pglite" | "postgresql";
  /** Rows per table at the time of the backup ("schema.table"), checked again after a restore. */
  rows: Record<string, number>;
  /** Every other file of the archive, with its SHA-256 digest (hex) and size. */
  files: { path: string; sha256: string; bytes: number }[];
  /**
   * The photo originals fetched from the upload service (each also listed in `files`): which photo, its key
   * at the service when backed up, and the file under originals/. Absent in backups made before originals
   * were included.
   */
  originals?: {
    photoId: string;
    /** The photo as a person finds it: site code, register number or plan underlay, file name, id. */
    photo: string;
    fileKey: string;
    fileName: string;
    mimeType: string;
    path: string;
    sha256: string;
    bytes: number;
  }[];
  /** Photos the demo seed made without an original (nothing to fetch for them). */
  seededPhotos?: number;
};

export const MANIFEST = "manifest.json";
export const PGLITE_DUMP = "database/pglite-data.tar.gz";
export const POSTGRES_DUMP = "database/postgresql.dump";
export const FILES = "files";
export const ORIGINALS = "originals";

/** A backup that cannot be restored as it stands: the message says why, and nothing has been written. */
export class BackupRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = "BackupRefused";
  }
}

export async function sha256File(file: string): Promise<{ sha256: string; bytes: number }> {
  const hash = createHash("sha256");
  let bytes = 0;
  for await (const chunk of createReadStream(file)) {
    hash.update(chunk as Buffer);
    bytes += (chunk as Buffer).length;
  }
  return { sha256: hash.digest("hex"), bytes };
}

/** Every regular file under `root`, as POSIX paths relative to it, sorted. */
export async function listFiles(root: string): Promise<string[]> {
  const out: string[] = [];
  const walk = async (dir: string) => {
    let entries;
    try {
      entries = await readdir(dir, { withFileTypes: true });
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === "ENOENT") return;
      throw err;
    }
    for (const e of entries) {
      const full = path.join(dir, e.name);
      if (e.isDirectory()) await walk(full);
      else if (e.isFile()) out.push(path.relative(root, full).split(path.sep).join("/"));
    }
  };
  await walk(root);
  return out.sort();
}

/**
 * Checks an unpacked backup against its manifest: every file listed is there with its digest, and nothing is
 * there that the manifest does not list. Throws BackupRefused naming the first files that differ.
 */
export async function verifyUnpacked(dir: string, manifest: BackupManifest): Promise<void> {
  const listed = new Map(manifest.files.map((f) => [f.path, f]));
  const present = (await listFiles(dir)).filter((p) => p !== MANIFEST);
  const problems: string[] = [];
  for (const p of present) if (!listed.has(p)) problems.push(`${p} is in the archive but not in its manifest`);
  for (const f of manifest.files) {
    if (!present.includes(f.path)) {
      problems.push(`${f.path} is listed in the manifest but missing from the archive`);
      continue;
    }
    const got = await sha256File(path.join(dir, ...f.path.split("/")));
    if (got.sha256 !== f.sha256 || got.bytes !== f.bytes)
      problems.push(`${f.path} does not match its SHA-256 digest in the manifest`);
  }
  if (problems.length)
    throw new BackupRefused(
      `The backup is damaged and was not restored (nothing was written): ${problems.slice(0, 5).join("; ")}${problems.length > 5 ? `; and ${problems.length - 5} more` : ""}.`,
    );
}

/** Parses manifest.json, refusing anything that is not a Loamwork backup of a version this install reads. */
export function parseManifest(text: string): BackupManifest {
  let m: Partial<BackupManifest>;
  try {
    m = JSON.parse(text) as Partial<BackupManifest>;
  } catch {
    throw new BackupRefused(
      "The backup's manifest.json is not valid JSON: the archive is damaged. Nothing was restored.",
    );
  }
  if (m.format !== "loamwork-backup" || m.version !== 1 || !Array.isArray(m.files) || !m.rows)
    throw new BackupRefused("This file is not a Loamwork backup (its manifest.json is not one). Nothing was restored.");
  if (m.engine !== "pglite" && m.engine !== "postgresql")
    throw new BackupRefused(`The backup names an unknown database engine (${String(m.engine)}). Nothing was restored.`);
  if (m.originals !== undefined) {
    const listed = new Map(m.files.map((f) => [f.path, f]));
    const bad = !Array.isArray(m.originals)
      ? ["originals is not a list"]
      : m.originals
          .filter((o) => {
            const f = listed.get(o?.path);
            return (
              typeof o?.photoId !== "string" ||
              typeof o.fileKey !== "string" ||
              typeof o.fileName !== "string" ||
              typeof o.mimeType !== "string" ||
              !o.path.startsWith(`${ORIGINALS}/`) ||
              !f ||
              f.sha256 !== o.sha256 ||
              f.bytes !== o.bytes
            );
          })
          .map((o) => String(o?.photo ?? o?.path));
    if (bad.length)
      throw new BackupRefused(
        `The backup's manifest.json lists photo originals that do not match its files (${bad.slice(0, 5).join("; ")}): the archive is damaged. Nothing was restored.`,
      );
  }
  return m as BackupManifest;
}
