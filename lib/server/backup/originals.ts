import "server-only";
import { createHash } from "node:crypto";
import { createWriteStream } from "node:fs";
import { mkdir, readFile } from "node:fs/promises";
import path from "node:path";
import { Readable, Transform } from "node:stream";
import { pipeline } from "node:stream/promises";
import type { ReadableStream as WebReadableStream } from "node:stream/web";
import { UTApi, UTFile } from "uploadthing/server";
import { forgetUpload, isSeededPhotoKey, signedUrl } from "../uploads/remote";
import { BackupRefused, ORIGINALS, type BackupManifest } from "./manifest";

/**
 * Photo originals (plan underlays and record photos) live at the upload service, not in the files store. A
 * backup fetches each one the database refers to through the service's own API, signed with the app's key,
 * into the archive; a restore puts each back at the service the install is configured for and, when the
 * service gave it a new key, rewrites the photo's key in the same transaction that loads the database.
 */

type Queryable = { query: (text: string) => Promise<{ rows: unknown[] }> };

export type OriginalEntry = NonNullable<BackupManifest["originals"]>[number];

type PhotoRow = {
  id: string;
  site: string;
  kind: "plan" | "record";
  number: number | null;
  trench: string | null;
  file_name: string;
  mime_type: string;
  file_key: string;
};

/** How a person finds the photo in Loamwork: site, register number or plan underlay, and file name. */
function describe(p: PhotoRow): string {
  const which = p.kind === "record" ? `photo ${p.number}` : `plan photo${p.trench ? ` of trench ${p.trench}` : ""}`;
  return `${p.site} ${which} “${p.file_name}” (id ${p.id})`;
}

/** Every photo whose original the upload service keeps, and how many the demo seed made without one. */
export async function photosWithOriginals(db: Queryable): Promise<{ photos: PhotoRow[]; seeded: number }> {
  const { rows } = await db.query(
    `select p.id::text as id, s.code as site, p.kind::text as kind, p.number, t.code as trench,
            p.file_name, p.mime_type, p.file_key
     from public.photos p join public.sites s on s.id = p.site_id left join public.trenches t on t.id = p.trench_id
     order by s.code, p.kind, p.number nulls last, p.created_at, p.id`,
  );
  const all = rows as PhotoRow[];
  const photos = all.filter((p) => !isSeededPhotoKey(p.file_key));
  return { photos, seeded: all.length - photos.length };
}

const uploadService = () => Boolean(process.env.UPLOADTHING_TOKEN);

/** Streams the original at `fileKey` into `file`, hashing it on the way; throws when the service refuses. */
async function download(fileKey: string, file: string): Promise<{ sha256: string; bytes: number }> {
  const res = await fetch(await signedUrl(fileKey));
  if (!res.ok || !res.body) {
    await res.body?.cancel();
    throw new Error(`the upload service answered ${res.status}${res.status === 404 ? " (no such file)" : ""}`);
  }
  const hash = createHash("sha256");
  let bytes = 0;
  await pipeline(
    Readable.fromWeb(res.body as WebReadableStream<Uint8Array>),
    new Transform({
      transform(chunk: Buffer, _enc, done) {
        hash.update(chunk);
        bytes += chunk.length;
        done(null, chunk);
      },
    }),
    createWriteStream(file),
  );
  return { sha256: hash.digest("hex"), bytes };
}

/**
 * Fetches every original into `work/originals/<photo id>`. One that cannot be fetched fails the whole
 * backup, naming every such photo: a backup that silently lacks originals would be found out only after the
 * service is gone.
 */
export async function fetchOriginals(work: string, photos: PhotoRow[]): Promise<OriginalEntry[]> {
  if (!photos.length) return [];
  if (!uploadService())
    throw new Error(
      `${photos.length} photo(s) have their originals at the upload service, but no upload service is configured (UPLOADTHING_TOKEN is not set), so none could be fetched. Set the upload service's settings as the server has them and back up again. No backup was written.`,
    );
  await mkdir(path.join(work, ORIGINALS));
  const out: OriginalEntry[] = [];
  const failed: string[] = [];
  for (const p of photos) {
    const rel = `${ORIGINALS}/${p.id}`;
    try {
      const got = await download(p.file_key, path.join(work, rel));
      out.push({
        photoId: p.id,
        photo: describe(p),
        fileKey: p.file_key,
        fileName: p.file_name,
        mimeType: p.mime_type,
        path: rel,
        ...got,
      });
    } catch (err) {
      failed.push(`${describe(p)}: ${(err as Error).message}`);
    }
  }
  if (failed.length)
    throw new Error(
      `The original of ${failed.length} of ${photos.length} photo(s) could not be fetched from the upload service, so no backup was written: ${failed
        .slice(0, 10)
        .join("; ")}${failed.length > 10 ? `; and ${failed.length - 10} more` : ""}.`,
    );
  return out;
}

/** Refuses, before anything is written, a backup holding originals when this install has no upload service. */
export function assertOriginalsCanGoBack(manifest: BackupManifest): void {
  const n = manifest.originals?.length ?? 0;
  if (n && !uploadService())
    throw new BackupRefused(
      `This backup holds the originals of ${n} photo(s), but this install has no upload service configured (UPLOADTHING_TOKEN is not set) to put them back at. Configure it as the server will run, then restore again. Nothing was restored.`,
    );
}

export type KeyRewrite = { photoId: string; from: string; to: string };

/** The service already holds this key with exactly these bytes (the service was not lost): keep it. */
async function alreadyThere(fileKey: string, sha256: string): Promise<boolean> {
  try {
    const res = await fetch(await signedUrl(fileKey));
    if (!res.ok) {
      await res.body?.cancel();
      return false;
    }
    return (
      createHash("sha256")
        .update(Buffer.from(await res.arrayBuffer()))
        .digest("hex") === sha256
    );
  } catch {
    return false;
  }
}

/**
 * Puts every original of the backup back at the configured upload service through the SDK (UTApi), unless
 * the service still holds it under its key byte for byte. Returns the keys to rewrite in the database and
 * the new uploads, which the caller forgets if the database then fails to load. An original the service
 * refuses fails the restore, naming the photo, after the originals already sent are taken back.
 */
export async function putOriginalsBack(
  work: string,
  originals: OriginalEntry[],
): Promise<{ rewrites: KeyRewrite[]; kept: number; uploaded: string[] }> {
  const rewrites: KeyRewrite[] = [];
  const uploaded: string[] = [];
  let kept = 0;
  try {
    for (const o of originals) {
      if (await alreadyThere(o.fileKey, o.sha256)) {
        kept++;
        continue;
      }
      const bytes = await readFile(path.join(work, ...o.path.split("/")));
      const res = await new UTApi({ logLevel: "Error" }).uploadFiles(
        new UTFile([new Uint8Array(bytes)], o.fileName, { type: o.mimeType }),
      );
      if (res.error || !res.data)
        throw new Error(
          `the upload service refused the original of ${o.photo}: ${res.error?.message ?? "no reply"}. Nothing was restored.`,
        );
      uploaded.push(res.data.key);
      rewrites.push({ photoId: o.photoId, from: o.fileKey, to: res.data.key });
    }
  } catch (err) {
    await forgetUploads(uploaded);
    throw err;
  }
  return { rewrites, kept, uploaded };
}

/** Takes back originals sent during a restore that did not complete (best effort). */
export async function forgetUploads(keys: string[]): Promise<void> {
  for (const key of keys) await forgetUpload(key);
}

const literal = (s: string) => `'${s.replace(/'/g, "''")}'`;

/**
 * The key rewrites as one SQL statement that fails (so the transaction around it rolls back) unless every
 * photo took its new key: for the restore script PostgreSQL runs in one transaction.
 */
export function rewriteSql(rewrites: KeyRewrite[]): string {
  if (!rewrites.length) return "";
  const values = rewrites
    .map((r) => `(${literal(r.photoId)}::uuid, ${literal(r.from)}, ${literal(r.to)})`)
    .join(",\n  ");
  return `
DO $loamwork_rewrite$
DECLARE n integer;
BEGIN
  UPDATE public.photos p SET file_key = v.new_key
  FROM (VALUES
  ${values}
  ) AS v(id, old_key, new_key)
  WHERE p.id = v.id AND p.file_key = v.old_key;
  GET DIAGNOSTICS n = ROW_COUNT;
  IF n <> ${rewrites.length} THEN
    RAISE EXCEPTION 'only % of ${rewrites.length} photos took the new keys of their originals', n;
  END IF;
END
$loamwork_rewrite$;
`;
}
