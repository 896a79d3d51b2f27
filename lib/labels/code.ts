/**
 * What a label's QR code holds: the site code, the kind of record and its number, in a short stable form that
 * outlives any one server. Bare, it reads `LW/WHD26/F/1234`; with the site's address in front it is a link,
 * `https://loamwork.example.org/l/WHD26/F/1234`, that any phone camera opens. Boxes of the finds store carry
 * `B` and their box number. Loamwork's scanner reads both,
 * and any address in front (a server moved since the labels were printed still resolves here).
 */
export const labelKinds = { F: "find", S: "sample", B: "box" } as const;
export type LabelKindLetter = keyof typeof labelKinds;
export type LabelRef = { siteCode: string; kind: LabelKindLetter; number: number };

const siteCodePattern = /^[A-Za-z0-9-]{2,20}$/;

/** The code printed on a label. */
export function labelCode(ref: LabelRef, address?: string | null): string {
  if (!siteCodePattern.test(ref.siteCode)) throw new Error(`not a site code: ${ref.siteCode}`);
  if (!Number.isInteger(ref.number) || ref.number < 1) throw new Error(`not a record number: ${ref.number}`);
  const tail = `${encodeURIComponent(ref.siteCode)}/${ref.kind}/${ref.number}`;
  return address ? `${address.replace(/\/+$/, "")}/l/${tail}` : `LW/${tail}`;
}

/** The label a scanned text names, or null when it is not one of Loamwork's codes. */
export function parseLabelCode(text: string): LabelRef | null {
  const t = text.trim();
  const m =
    /^LW\/([A-Za-z0-9-]{2,20})\/([FSB])\/(\d{1,9})$/.exec(t) ??
    /^https?:\/\/[^\s]*?\/l\/([A-Za-z0-9-]{2,20})\/([FSB])\/(\d{1,9})\/?$/.exec(t);
  if (!m) return null;
  const number = Number(m[3]);
  if (number < 1) return null;
  return { siteCode: m[1]!, kind: m[2] as LabelKindLetter, number };
}

/** Where Loamwork resolves a label, on whichever server reads it. */
export function labelPath(ref: LabelRef): string {
  return `/l/${encodeURIComponent(ref.siteCode)}/${ref.kind}/${ref.number}`;
}
