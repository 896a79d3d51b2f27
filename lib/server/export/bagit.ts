import "server-only";
import { createHash } from "node:crypto";
import { Zip, ZipDeflate, ZipPassThrough, strToU8 } from "fflate";

/**
 * A BagIt bag (RFC 8493) written as one zip file, streamed: payload files are hashed as they go into the
 * zip, and the tag files (bagit.txt, the SHA-256 manifest, bag-info.txt, the tag manifest) follow them —
 * the zip's order allows tag files last, so the payload's digests are known when the manifest is written.
 * Only the chunk being added is held in memory, never the whole bag nor a whole large file.
 */

/** A file's content: whole, or in chunks made as the zip asks for them (a large register). */
export type BagContent = Uint8Array | AsyncIterable<Uint8Array>;

/** One payload file; `path` is relative to the bag's `data/` folder. Already-compressed files are stored. */
export type BagFile = { path: string; bytes: BagContent; compressed?: boolean };

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
 * The bag as zip bytes, chunk by chunk, its entries under the folder `root`. Payload files are pulled from
 * `files` one at a time, as the consumer asks for more (a file on disk or a response body). `onFile` hears
 * each payload file once it is in. The package's fingerprint is the SHA-256 of manifest-sha256.txt; it goes
 * into bag-info.txt (covered by the tag manifest) and is the generator's return value with the sizes.
 */
export async function* bagZip(
  root: string,
  files: AsyncIterable<BagFile>,
  info: (summary: Omit<BagSummary, "fingerprint">) => BagInfoLines,
  onFile?: (path: string) => void,
): AsyncGenerator<Uint8Array, BagSummary> {
  const ready: Uint8Array[] = [];
  let failure: Error | null = null;
  // fflate calls this synchronously inside each push; the chunks are handed on before the next push.
  const zip = new Zip((err, chunk) => {
    if (err) failure = err;
    else ready.push(chunk);
  });
  function* drain() {
    if (failure) throw failure;
    while (ready.length) yield ready.shift()!;
  }
  const mtime = new Date();

  async function* add(path: string, content: BagContent, compressed = false) {
    const name = `${root}/${path}`;
    const entry = compressed ? new ZipPassThrough(name) : new ZipDeflate(name, { level: 6 });
    entry.mtime = mtime;
    zip.add(entry);
    const hash = createHash("sha256");
    let size = 0;
    if (content instanceof Uint8Array) {
      hash.update(content);
      size = content.byteLength;
      entry.push(content, true);
      yield* drain();
    } else {
      for await (const chunk of content) {
        hash.update(chunk);
        size += chunk.byteLength;
        entry.push(chunk, false);
        yield* drain();
      }
      entry.push(new Uint8Array(0), true);
      yield* drain();
    }
    return { digest: hash.digest("hex"), size };
  }

  const manifest: [string, string][] = [];
  let octets = 0;
  for await (const file of files) {
    const path = `data/${file.path}`;
    const { digest, size } = yield* add(path, file.bytes, file.compressed);
    manifest.push([path, digest]);
    octets += size;
    onFile?.(path);
  }
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
  for (const [path, bytes] of tags) yield* add(path, bytes);
  yield* add("tagmanifest-sha256.txt", strToU8(manifestText(tags.map(([path, bytes]) => [path, sha256(bytes)]))));
  zip.end();
  yield* drain();
  return summary;
}

/** The bag as a response body: each chunk made when the reader asks for it; a cancelled download stops it. */
export function bagZipStream(chunks: AsyncGenerator<Uint8Array, unknown>): ReadableStream<Uint8Array> {
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      const next = await chunks.next();
      if (next.done) controller.close();
      else controller.enqueue(next.value);
    },
    async cancel() {
      await chunks.return(undefined);
    },
  });
}
