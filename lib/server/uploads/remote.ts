import "server-only";
import { UTApi } from "uploadthing/server";

/**
 * Originals stay private at the upload service: the app reads one through a short-lived URL signed with
 * its own key (UTApi.generateSignedURL; locally UPLOADTHING_UFS_HOST points it at the stand-in), and
 * members get it only through the member-checked file route.
 */
export async function signedUrl(fileKey: string): Promise<string> {
  const { ufsUrl } = await new UTApi({ logLevel: "Error" }).generateSignedURL(fileKey, { expiresIn: 60 });
  return ufsUrl;
}

/**
 * The key the demo seed gives its invented plan photo, which was never uploaded and so has no original
 * anywhere. The upload service never issues such a key (its keys hold no "-").
 */
export const seededPhotoKey = (photoId: string) => `demo-${photoId}`;
export const isSeededPhotoKey = (fileKey: string) => fileKey.startsWith("demo-");

const FETCH_TIMEOUT_MS = 60_000;

/** Fetches the original an upload left at the upload service (the stand-in locally). */
export async function fetchUpload(fileKey: string, maxBytes: number): Promise<Buffer> {
  // A service that stops answering must not hold a package or a backup for ever.
  const res = await fetch(await signedUrl(fileKey), { signal: AbortSignal.timeout(FETCH_TIMEOUT_MS) });
  if (!res.ok) throw new Error(`upload service answered ${res.status} for the stored file`);
  const bytes = Buffer.from(await res.arrayBuffer());
  if (bytes.length > maxBytes) throw new Error("the stored file is larger than the upload limit");
  return bytes;
}

/** Best effort: a refused upload, or the original of a deleted photo, goes; a failure is logged, not shown. */
export async function forgetUpload(fileKey: string): Promise<void> {
  if (!process.env.UPLOADTHING_TOKEN) return;
  try {
    const out = await new UTApi({ logLevel: "Error" }).deleteFiles(fileKey);
    if (!out.success || out.deletedCount !== 1)
      console.warn("[loamwork] the upload service did not delete", fileKey, out);
  } catch (err) {
    console.warn("[loamwork] could not delete upload", fileKey, err);
  }
}
