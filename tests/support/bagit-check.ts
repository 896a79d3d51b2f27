import { createHash } from "node:crypto";

/**
 * A BagIt validator written from RFC 8493's rules, independent of the code that writes the package:
 * §2.1.1 bagit.txt (its two lines), §2.1.3 payload manifest (every payload file listed once with the
 * right digest, nothing listed that is not there), §2.2.1 tag manifest, §2.2.2 bag-info.txt (label: value
 * lines, Payload-Oxum), §3 (a complete bag is valid when every digest checks). Files are the unzipped
 * entries, keyed by their path inside the zip; the bag is the zip's single top folder.
 */
export type BagCheck = { problems: string[]; root: string; files: Map<string, Uint8Array>; info: Map<string, string> };

const text = (b: Uint8Array | undefined) => (b ? new TextDecoder("utf-8", { fatal: true }).decode(b) : "");
const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

/** Manifest lines: "<digest> <path>" with one or more spaces or tabs between (RFC 8493 §2.1.3). */
function readManifest(body: string, name: string, problems: string[]): Map<string, string> {
  const out = new Map<string, string>();
  if (body && !body.endsWith("\n")) problems.push(`${name}: the last line has no line end`);
  for (const line of body.split(/\r\n|\r|\n/).filter((l) => l !== "")) {
    const m = /^([0-9a-fA-F]{64})[ \t]+(.+)$/.exec(line);
    if (!m) {
      problems.push(`${name}: malformed line "${line}"`);
      continue;
    }
    const path = m[2]!.replace(/%0D/gi, "\r").replace(/%0A/gi, "\n").replace(/%25/g, "%");
    if (path.startsWith("/") || path.split("/").includes("..")) problems.push(`${name}: path ${path} leaves the bag`);
    if (out.has(path)) problems.push(`${name}: ${path} listed twice`);
    out.set(path, m[1]!.toLowerCase());
  }
  return out;
}

export function checkBag(entries: Record<string, Uint8Array>): BagCheck {
  const problems: string[] = [];
  const roots = new Set(Object.keys(entries).map((p) => p.split("/")[0]));
  const root = [...roots][0] ?? "";
  if (roots.size !== 1) problems.push(`the zip holds ${roots.size} top folders, not one bag`);
  const files = new Map<string, Uint8Array>();
  for (const [p, bytes] of Object.entries(entries)) if (!p.endsWith("/")) files.set(p.slice(root.length + 1), bytes);

  const bagit = text(files.get("bagit.txt"));
  if (!/^BagIt-Version: \d+\.\d+\r?\nTag-File-Character-Encoding: UTF-8\r?\n$/.test(bagit))
    problems.push(`bagit.txt is not the two lines RFC 8493 §2.1.1 requires: ${JSON.stringify(bagit)}`);

  const manifestBytes = files.get("manifest-sha256.txt");
  if (!manifestBytes) problems.push("manifest-sha256.txt is missing");
  const manifest = readManifest(text(manifestBytes), "manifest-sha256.txt", problems);
  const payload = [...files.keys()].filter((p) => p.startsWith("data/"));
  for (const p of payload) if (!manifest.has(p)) problems.push(`payload file ${p} is not in the manifest`);
  let octets = 0;
  for (const [p, digest] of manifest) {
    if (!p.startsWith("data/")) problems.push(`manifest lists ${p}, outside data/`);
    const bytes = files.get(p);
    if (!bytes) {
      problems.push(`manifest lists ${p}, which is not in the bag`);
      continue;
    }
    octets += bytes.byteLength;
    if (sha256(bytes) !== digest) problems.push(`${p}: digest does not match the manifest`);
  }

  const tagBytes = files.get("tagmanifest-sha256.txt");
  if (!tagBytes) problems.push("tagmanifest-sha256.txt is missing");
  const tags = readManifest(text(tagBytes), "tagmanifest-sha256.txt", problems);
  const tagFiles = [...files.keys()].filter((p) => !p.startsWith("data/") && !p.startsWith("tagmanifest-"));
  for (const p of tagFiles) if (!tags.has(p)) problems.push(`tag file ${p} is not in the tag manifest`);
  for (const [p, digest] of tags) {
    const bytes = files.get(p);
    if (p.startsWith("data/")) problems.push(`tag manifest lists payload file ${p}`);
    if (!bytes) problems.push(`tag manifest lists ${p}, which is not in the bag`);
    else if (sha256(bytes) !== digest) problems.push(`${p}: digest does not match the tag manifest`);
  }

  const info = new Map<string, string>();
  let last: string | null = null;
  for (const line of text(files.get("bag-info.txt")).split(/\r\n|\r|\n/)) {
    if (line === "") continue;
    if (/^[ \t]/.test(line) && last) {
      info.set(last, `${info.get(last)} ${line.trim()}`);
      continue;
    }
    const m = /^([^:\s][^:]*?): (.*)$/.exec(line);
    if (!m) {
      problems.push(`bag-info.txt: malformed line "${line}"`);
      continue;
    }
    last = m[1]!;
    info.set(last, m[2]!);
  }
  const oxum = info.get("Payload-Oxum");
  if (oxum && oxum !== `${octets}.${manifest.size}`)
    problems.push(`Payload-Oxum says ${oxum}, the payload is ${octets}.${manifest.size}`);
  return { problems, root, files, info };
}
