/** The upload fake's disk: one data file and one JSON sidecar per file key. */
import { createHash } from "node:crypto";
import { mkdir, open, readFile, readdir, rm, stat, writeFile } from "node:fs/promises";
import path from "node:path";

export type StoredMeta = {
  key: string;
  name: string;
  size: number;
  type: string;
  customId: string | null;
  lastModified: number;
  /** Bytes received so far; equals size once complete. */
  received: number;
  fileHash: string | null;
  uploadedAt: number | null;
};

export function fakeStore(dir: string) {
  const dataPath = (key: string) => path.join(dir, encodeURIComponent(key));
  const metaPath = (key: string) => `${dataPath(key)}.json`;

  async function meta(key: string): Promise<StoredMeta | null> {
    try {
      return JSON.parse(await readFile(metaPath(key), "utf8")) as StoredMeta;
    } catch {
      return null;
    }
  }

  return {
    init: () => mkdir(dir, { recursive: true }),
    meta,
    async received(key: string): Promise<number> {
      return (await meta(key))?.received ?? 0;
    },
    /** Writes `bytes` at `offset`; completes the file (hash, time) when every declared byte is in. */
    async write(
      base: Omit<StoredMeta, "received" | "fileHash" | "uploadedAt">,
      offset: number,
      bytes: Uint8Array,
    ): Promise<StoredMeta> {
      const prior = await meta(base.key);
      const fh = await open(dataPath(base.key), offset === 0 ? "w" : "r+");
      try {
        await fh.write(bytes, 0, bytes.length, offset);
      } finally {
        await fh.close();
      }
      const received = offset + bytes.length;
      const done = received === base.size;
      const data = done ? await readFile(dataPath(base.key)) : null;
      const next: StoredMeta = {
        ...(prior ?? {}),
        ...base,
        received,
        fileHash: data ? createHash("md5").update(data).digest("hex") : null,
        uploadedAt: done ? Date.now() : null,
      };
      await writeFile(metaPath(base.key), JSON.stringify(next));
      return next;
    },
    read: (key: string) => readFile(dataPath(key)),
    async remove(key: string): Promise<boolean> {
      const existed = (await meta(key)) !== null;
      await rm(dataPath(key), { force: true });
      await rm(metaPath(key), { force: true });
      return existed;
    },
    async list(): Promise<StoredMeta[]> {
      const names = (await readdir(dir)).filter((n) => n.endsWith(".json"));
      const all = await Promise.all(names.map((n) => meta(decodeURIComponent(n.slice(0, -5)))));
      return all.filter((m): m is StoredMeta => m !== null).sort((a, b) => (a.uploadedAt ?? 0) - (b.uploadedAt ?? 0));
    },
    exists: (key: string) =>
      stat(dataPath(key)).then(
        () => true,
        () => false,
      ),
  };
}

export type FakeStore = ReturnType<typeof fakeStore>;
