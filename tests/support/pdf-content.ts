import { PDFArray, PDFDocument, PDFRawStream, decodePDFRawStream, type PDFObject } from "pdf-lib";

/** Each page's content stream(s), decoded to the PDF operators as text (pdf-lib loads the file first). */
export async function pdfContent(bytes: Uint8Array): Promise<string[]> {
  const doc = await PDFDocument.load(bytes);
  return doc.getPages().map((page) => {
    const contents = page.node.Contents();
    const streams: PDFObject[] =
      contents instanceof PDFArray
        ? contents.asArray().map((ref) => doc.context.lookup(ref)!)
        : contents
          ? [contents]
          : [];
    return streams
      .filter((s): s is PDFRawStream => s instanceof PDFRawStream)
      .map((s) => new TextDecoder("latin1").decode(decodePDFRawStream(s).decode()))
      .join("\n");
  });
}

/** One marked-content sequence's fill colour and path: its `m`, `c`, `l` operators with their numbers. */
export type MarkedPath = { fill: [number, number, number]; fills: number; ops: { op: string; args: number[] }[] };

/** Every `/<tag> BMC … EMC` sequence of a page's operators, read as one filled path. */
export function markedPaths(content: string, tag: string): MarkedPath[] {
  const out: MarkedPath[] = [];
  for (const m of content.matchAll(new RegExp(`/${tag}\\s+BMC([\\s\\S]*?)EMC`, "g"))) {
    const body = m[1]!;
    const rg = /([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+rg/.exec(body);
    const ops: MarkedPath["ops"] = [];
    for (const line of body.matchAll(/((?:-?[\d.]+\s+)+)([mlc])\b/g))
      ops.push({ op: line[2]!, args: line[1]!.trim().split(/\s+/).map(Number) });
    out.push({
      fill: rg ? [Number(rg[1]), Number(rg[2]), Number(rg[3])] : [NaN, NaN, NaN],
      fills: [...body.matchAll(/(^|\s)B(\s|$)/g)].length,
      ops,
    });
  }
  return out;
}
