import { PDFArray, PDFDocument, PDFRawStream, decodePDFRawStream, type PDFObject } from "pdf-lib";

/**
 * The text shown on each page of a PDF, read back from its content streams: the strings of every Tj and TJ
 * operator, hex or literal, as single-byte characters (enough for the standard fonts' WinAnsi text that
 * Loamwork writes). pdf-lib's own parser loads the file, so a malformed PDF fails here first.
 */
export async function pdfText(bytes: Uint8Array): Promise<{ pages: string[]; title: string | undefined }> {
  const doc = await PDFDocument.load(bytes);
  const pages = doc.getPages().map((page) => {
    const contents = page.node.Contents();
    const streams: PDFObject[] =
      contents instanceof PDFArray
        ? contents.asArray().map((ref) => doc.context.lookup(ref)!)
        : contents
          ? [contents]
          : [];
    let text = "";
    for (const stream of streams) {
      if (!(stream instanceof PDFRawStream)) continue;
      const ops = new TextDecoder("latin1").decode(decodePDFRawStream(stream).decode());
      for (const m of ops.matchAll(/<([0-9A-Fa-f\s]*)>\s*Tj|\(((?:\\.|[^\\)])*)\)\s*Tj/g)) {
        text +=
          m[1] !== undefined
            ? (m[1].replace(/\s/g, "").match(/../g) ?? []).map((h) => String.fromCharCode(parseInt(h, 16))).join("")
            : m[2]!.replace(/\\(.)/g, "$1");
        text += "\n";
      }
    }
    return text;
  });
  return { pages, title: doc.getTitle() };
}
