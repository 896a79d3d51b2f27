import "server-only";
import { createHash } from "node:crypto";
import { Zip, ZipDeflate, ZipPassThrough, strToU8 } from "fflate";

/**
 * A BagIt bag (RFC 8493) written as one zip file, streamed: payload files are hashed as they go into the
 * zip, and the tag files (bagit.txt, the SHA-256 manifest, bag-info.txt, the tag manifest) follow them.
 * Only the file being added is held in memory, never the whole bag.
 */

/** One payload file; `path` is relative to the bag's `data/` folder. Already-compressed files are stored. */
export type BagFile = { path: string; bytes: Uint8Array; compressed?: boolean };

/** What bag-info.txt says besides the sizes and the fingerprint, in order: [label, value]. */
export type BagInfoLines = [label: string, value: string][];

export type BagSummary = { files: number; octets: number; fingerprint: string };

const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/** RFC 8493 §2.1.3: a manifest names a file with CR, LF and % percent-encoded, "/" between folders. */
export function manifestPath(path: string): string {
  return path.replace(/%/g, "%25").replace(/\r/g, "%0D").replace(/\n/g, "%0A");
}

/** A manifest: one "digest path" line a file, LF line ends (RFC 8493 §2.1.3). */
export function manifestText(entries: [path: string, digest: string][]): string {
  return entries.map(([path, digest]) => `${digest}  ${manifestPath(path)}\n`).join("");
}

/** bag-info.txt lines "Label: value"; a value never spans lines here (newlines become spaces). */
export function bagInfoText(lines: BagInfoLines): string {
  return lines.map(([label, value]) => `${label}: ${value.replace(/[\r\n]+/g, " ")}\n`).join("");
}

export const BAGIT_TXT = "BagIt-Version: 1.0\nTag-File-Character-Encoding: UTF-8\n";

/**
 * Streams the bag as a zip whose entries sit under the folder `root`. Payload files are pulled from `files`
 * one at a time, as the reader asks for more. The package's fingerprint is the SHA-256 of
 * manifest-sha256.txt; it goes into bag-info.txt (covered by the tag manifest) and to `onDone`.
 */
export function bagZipStream(
  root: string,
  files: AsyncIterable<BagFile>,
  info: (summary: Omit<BagSummary, "fingerprint">) => BagInfoLines,
  onDone?: (summary: BagSummary) => void,
): ReadableStream<Uint8Array> {
  const iterator = files[Symbol.asyncIterator]();
  const manifest: [string, string][] = [];
  let octets = 0;
  let finished = false;
  let zip: Zip;
  const mtime = new Date();

  const add = (path: string, bytes: Uint8Array, compressed = false) => {
    const name = `${root}/${path}`;
    const entry = compressed ? new ZipPassThrough(name) : new ZipDeflate(name, { level: 6 });
    entry.mtime = mtime;
    zip.add(entry);
    entry.push(bytes, true);
  };

  return new ReadableStream<Uint8Array>({
    start(controller) {
      zip = new Zip((err, chunk, final) => {
        if (err) return controller.error(err);
        controller.enqueue(chunk);
        if (final) controller.close();
      });
    },
    async pull() {
      if (finished) return;
      const next = await iterator.next();
      if (!next.done) {
        const file = next.value;
        const path = `data/${file.path}`;
        manifest.push([path, sha256(file.bytes)]);
        octets += file.bytes.byteLength;
        add(path, file.bytes, file.compressed);
        return;
      }
      finished = true;
      const manifestBytes = strToU8(manifestText(manifest));
      const summary: BagSummary = { files: manifest.length, octets, fingerprint: sha256(manifestBytes) };
      const tags: [string, Uint8Array][] = [
        ["bagit.txt", strToU8(BAGIT_TXT)],
        ["manifest-sha256.txt", manifestBytes],
        [
          "bag-info.txt",
          strToU8(
            bagInfoText([
              ...info(summary),
              ["Payload-Oxum", `${octets}.${manifest.length}`],
              ["Package-Fingerprint", `sha256:${summary.fingerprint}`],
            ]),
          ),
        ],
      ];
      for (const [path, bytes] of tags) add(path, bytes);
      add("tagmanifest-sha256.txt", strToU8(manifestText(tags.map(([path, bytes]) => [path, sha256(bytes)]))));
      zip.end();
      onDone?.(summary);
    },
    async cancel() {
      finished = true;
      await iterator.return?.();
    },
  });
}
