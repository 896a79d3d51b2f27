import "server-only";
import { UTApi } from "uploadthing/server";

/** Fetches the original an upload left at the upload service (the fake locally). */
export async function fetchUpload(url: string, maxBytes: number): Promise<Buffer> {
  const res = await fetch(url);
  if (!res.ok) throw new Error(`upload service answered ${res.status} for the stored file`);
  const bytes = Buffer.from(await res.arrayBuffer());
  if (bytes.length > maxBytes) throw new Error("the stored file is larger than the upload limit");
  return bytes;
}

/** Best effort: the original is not needed once the derivatives exist; a failure is logged, not shown. */
export async function forgetUpload(fileKey: string): Promise<void> {
  if (!process.env.UPLOADTHING_TOKEN) return;
  try {
    await new UTApi({ logLevel: "Error" }).deleteFiles(fileKey);
  } catch (err) {
    console.warn("[loamwork] could not delete upload", fileKey, err);
  }
}
