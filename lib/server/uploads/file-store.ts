import "server-only";
import { mkdir, readFile, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { env } from "@/lib/env";

/** Photo derivatives live under LOAMWORK_FILES_DIR/photos/<site>/<photo>/; paths in the database are relative. */
export function photoFolder(siteId: string, photoId: string): string {
  return path.posix.join("photos", siteId, photoId);
}

/** The file's place on disk, for reading or writing it as a stream (a package too large to hold). */
export function storePath(relative: string): string {
  return absolute(relative);
}

function absolute(relative: string): string {
  const root = path.resolve(env().LOAMWORK_FILES_DIR);
  const full = path.resolve(root, relative);
  if (!full.startsWith(root + path.sep)) throw new Error(`file store: ${relative} escapes the store`);
  return full;
}

export async function saveFile(relative: string, bytes: Buffer): Promise<void> {
  const full = absolute(relative);
  await mkdir(path.dirname(full), { recursive: true });
  await writeFile(full, bytes);
}

export async function loadFile(relative: string): Promise<Buffer | null> {
  try {
    return await readFile(absolute(relative));
  } catch {
    return null;
  }
}

export async function removeFolder(relative: string): Promise<void> {
  await rm(absolute(relative), { recursive: true, force: true });
}
