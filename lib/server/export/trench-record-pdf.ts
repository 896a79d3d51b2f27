import "server-only";
import {
  PDFDocument,
  StandardFonts,
  appendBezierCurve,
  beginMarkedContent,
  closePath,
  drawSvgPath,
  endMarkedContent,
  fillAndStroke,
  lineTo,
  moveTo,
  popGraphicsState,
  pushGraphicsState,
  rgb,
  setFillingColor,
  setLineWidth,
  setStrokingColor,
  type PDFFont,
  type PDFOperator,
  type PDFPage,
} from "pdf-lib";
import type { PolygonJson } from "@/db/schema";
import { boundsOf } from "@/lib/geometry/plan-view";
import { symbolPath, type SymbolShape } from "@/lib/geometry/symbol-paths";
import { formatWhen } from "@/lib/words/when";
import type { TrenchRecord } from "./trench-record-data";

/**
 * The trench record as a PDF for the deposition package, written by pdf-lib (plain JavaScript, no browser):
 * summary and sign-off, the plan as vector lines (trench outline, context extents) with every find as its
 * class's symbol in its class's colour and a key, each context sheet with its relations, and the finds
 * counted by context and class. The standard Helvetica needs no font
 * file; a character it cannot show is written "?".
 */
const PAGE: [number, number] = [595.28, 841.89]; // A4 in points
const MARGIN = 50;
const WIDTH = PAGE[0] - 2 * MARGIN;
const INK = rgb(0.1, 0.1, 0.1);
const SOFT = rgb(0.45, 0.45, 0.45);

type Style = { size?: number; bold?: boolean; indent?: number; colour?: ReturnType<typeof rgb> };

/** A running column of text that turns the page when it reaches the bottom margin. */
class Writer {
  page!: PDFPage;
  y = 0;
  private readonly shown: Set<number>;

  constructor(
    private readonly doc: PDFDocument,
    private readonly regular: PDFFont,
    private readonly bold: PDFFont,
  ) {
    this.shown = new Set(regular.getCharacterSet());
    this.turn();
  }

  turn(): void {
    this.page = this.doc.addPage(PAGE);
    this.y = PAGE[1] - MARGIN;
  }

  /** Room for `height` points on this page, or a new page. */
  room(height: number): void {
    if (this.y - height < MARGIN + 16) this.turn();
  }

  clean(s: string): string {
    return [...s].map((ch) => (this.shown.has(ch.codePointAt(0) ?? 0) ? ch : "?")).join("");
  }

  /** Words wrapped to the column; a word longer than a line is broken where it must be. */
  private wrap(text: string, font: PDFFont, size: number, width: number): string[] {
    const lines: string[] = [];
    for (const paragraph of text.split(/\r?\n/)) {
      let line = "";
      for (const word of paragraph.split(/\s+/).filter(Boolean)) {
        const next = line ? `${line} ${word}` : word;
        if (font.widthOfTextAtSize(next, size) <= width) {
          line = next;
          continue;
        }
        if (line) lines.push(line);
        line = word;
        while (font.widthOfTextAtSize(line, size) > width && line.length > 1) {
          let cut = line.length - 1;
          while (cut > 1 && font.widthOfTextAtSize(line.slice(0, cut), size) > width) cut--;
          lines.push(line.slice(0, cut));
          line = line.slice(cut);
        }
      }
      lines.push(line);
    }
    return lines;
  }

  text(s: string, { size = 10, bold = false, indent = 0, colour = INK }: Style = {}): void {
    const font = bold ? this.bold : this.regular;
    for (const line of this.wrap(this.clean(s), font, size, WIDTH - indent)) {
      this.room(size * 1.3);
      this.page.drawText(line, { x: MARGIN + indent, y: this.y - size, size, font, color: colour });
      this.y -= size * 1.3;
    }
  }

  /** One row of cells at fixed offsets (a table line). */
  row(cells: [string, number][], { size = 9, bold = false }: Style = {}): void {
    this.room(size * 1.4);
    for (const [cell, x] of cells)
      this.page.drawText(this.clean(cell), {
        x: MARGIN + x,
        y: this.y - size,
        size,
        font: bold ? this.bold : this.regular,
      });
    this.y -= size * 1.4;
  }

  gap(points: number): void {
    this.y -= points;
  }
}

/** A scale bar length (metres) between about 60 and 160 points long at `k` points a metre. */
function scaleBar(k: number): number {
  for (const m of [0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50, 100, 200, 500]) if (m * k >= 60) return m;
  return 1000;
}

/** Radius of a find's symbol on the plan, in points (about 0.6 mm, as a find dot on a drawn plan). */
export const FIND_SYMBOL_R = 1.6;
/** The marked-content tag round each class's finds on the plan (one filled path per class). */
export const FINDS_TAG = "LoamworkFinds";

type PathSegment = { op: "m" | "l" | "c" | "h"; args: number[] };
const unitShapes = new Map<string, PathSegment[]>();

/**
 * A class symbol in its unit box (the shared shapes of lib/geometry/symbol-paths.ts, SVG axes: y down) as
 * PDF path segments, arcs already turned into curves by pdf-lib.
 */
function unitShape(symbol: string): PathSegment[] {
  const known = unitShapes.get(symbol);
  if (known) return known;
  const d = symbolPath[symbol as SymbolShape] ?? symbolPath.disc;
  const segments = drawSvgPath(d, { x: 0, y: 0, scale: 1, color: INK, borderColor: undefined, borderWidth: 0 })
    .map((op) => op.toString().trim().split(/\s+/))
    .filter((t) => ["m", "l", "c", "h"].includes(t[t.length - 1] ?? ""))
    .map((t) => ({ op: t[t.length - 1] as PathSegment["op"], args: t.slice(0, -1).map(Number) }));
  unitShapes.set(symbol, segments);
  return segments;
}

/** Two decimals of a point (a hundredth of a point is far below what prints) keep the plan's stream small. */
const pt = (n: number) => Math.round(n * 100) / 100;

/** "#rrggbb" as a pdf-lib colour; anything else grey. */
function colourOf(hex: string) {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  return m ? rgb(parseInt(m[1]!, 16) / 255, parseInt(m[2]!, 16) / 255, parseInt(m[3]!, 16) / 255) : SOFT;
}

/**
 * Every find of a class as one filled and outlined path: one fill however many finds there are, so a trench
 * of thousands of finds stays a small file. Wrapped in a marked-content sequence so a reader can tell the
 * plan's finds from the key.
 */
function classSymbols(
  page: PDFPage,
  symbol: string,
  colour: string,
  points: Iterable<{ x: number; y: number }>,
  r: number,
  tag?: string,
): number {
  const shape = unitShape(symbol);
  const ops: PDFOperator[] = [];
  if (tag) ops.push(beginMarkedContent(tag));
  ops.push(pushGraphicsState(), setFillingColor(colourOf(colour)), setStrokingColor(INK), setLineWidth(0.3));
  let n = 0;
  for (const p of points) {
    n++;
    for (const s of shape) {
      const a = s.args;
      const x = (i: number) => pt(p.x + r * a[i]!);
      const y = (i: number) => pt(p.y - r * a[i + 1]!);
      if (s.op === "m") ops.push(moveTo(x(0), y(0)));
      else if (s.op === "l") ops.push(lineTo(x(0), y(0)));
      else if (s.op === "c") ops.push(appendBezierCurve(x(0), y(0), x(2), y(2), x(4), y(4)));
      else ops.push(closePath());
    }
  }
  ops.push(fillAndStroke(), popGraphicsState());
  if (tag) ops.push(endMarkedContent());
  if (n) page.pushOperators(...ops);
  return n;
}

/**
 * The plan: the trench outline and the contexts' extents as lines, numbered, every find as its class's
 * symbol, with a scale bar and grid north; then the key to the finds' symbols.
 */
function drawPlan(
  w: Writer,
  outline: PolygonJson,
  extents: { number: number; extent: PolygonJson }[],
  finds: TrenchRecord["findPoints"],
): void {
  const all = [outline, ...extents.map((e) => e.extent)].flatMap((p) => p.coordinates.flat());
  if (!all.length) return;
  const { minX, maxX, minY, maxY } = boundsOf(all);
  const boxH = 360;
  const k = Math.min(WIDTH / Math.max(maxX - minX, 1e-6), (boxH - 30) / Math.max(maxY - minY, 1e-6));
  w.room(boxH);
  const top = w.y;
  const at = (x: number, y: number) => ({ x: MARGIN + (x - minX) * k, y: top - boxH + 30 + (y - minY) * k });
  const rings = (p: PolygonJson, thickness: number, colour: ReturnType<typeof rgb>) => {
    for (const ring of p.coordinates)
      for (let i = 1; i < ring.length; i++) {
        const [a, b] = [ring[i - 1]!, ring[i]!];
        w.page.drawLine({ start: at(a[0], a[1]), end: at(b[0], b[1]), thickness, color: colour });
      }
  };
  for (const e of extents) {
    rings(e.extent, 0.6, SOFT);
    const ring = e.extent.coordinates[0] ?? [];
    const cx = ring.reduce((s, p) => s + p[0], 0) / Math.max(ring.length, 1);
    const cy = ring.reduce((s, p) => s + p[1], 0) / Math.max(ring.length, 1);
    const p = at(cx, cy);
    w.page.drawText(String(e.number), { x: p.x - 8, y: p.y - 3, size: 7, color: SOFT });
  }
  rings(outline, 1.4, INK);
  for (const c of finds) {
    const page = w.page;
    function* placed() {
      for (let i = 0; i < c.x.length; i++) yield at(c.x[i]!, c.y[i]!);
    }
    classSymbols(page, c.symbol, c.colour, placed(), FIND_SYMBOL_R, FINDS_TAG);
  }
  const bar = scaleBar(k);
  const base = top - boxH + 8;
  w.page.drawLine({ start: { x: MARGIN, y: base }, end: { x: MARGIN + bar * k, y: base }, thickness: 2, color: INK });
  w.page.drawText(`${bar} m`, { x: MARGIN + bar * k + 6, y: base - 3, size: 8, color: INK });
  const nx = MARGIN + WIDTH - 10;
  w.page.drawLine({ start: { x: nx, y: base }, end: { x: nx, y: base + 24 }, thickness: 1.2, color: INK });
  w.page.drawText("N (grid)", { x: nx - 34, y: base + 28, size: 8, color: INK });
  w.y = top - boxH - 6;

  if (!finds.length) return;
  w.text("Key to the finds on the plan", { size: 9, bold: true });
  for (const c of finds) {
    w.room(12);
    classSymbols(w.page, c.symbol, c.colour, [{ x: MARGIN + 6, y: w.y - 5 }], 3.5);
    w.row([[`${c.classCode} ${c.classLabel}: ${c.x.length} find${c.x.length === 1 ? "" : "s"}`, 16]], { size: 8 });
  }
}

export async function trenchRecordPdf(r: TrenchRecord): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  const title = `Trench ${r.trench.code} record - ${r.site.code} ${r.site.name}`;
  doc.setTitle(title);
  doc.setProducer("Loamwork");
  doc.setCreationDate(r.exportedAt);
  const w = new Writer(
    doc,
    await doc.embedFont(StandardFonts.Helvetica),
    await doc.embedFont(StandardFonts.HelveticaBold),
  );

  w.text(`Trench record · ${r.site.code} ${r.site.name}`, { size: 9, colour: SOFT });
  w.text(`Trench ${r.trench.code}${r.trench.name ? ` - ${r.trench.name}` : ""}`, { size: 20, bold: true });
  const signed = r.contexts.filter((c) => c.state === "signed_off").length;
  if (r.signOff) {
    w.text(`Signed off by ${r.signOff.by} on ${formatWhen(r.signOff.at)}`, { size: 12, bold: true });
    if (r.signOff.fingerprint)
      w.text(`Fingerprint of the records at sign-off (SHA-256): ${r.signOff.fingerprint}`, { size: 8 });
  } else {
    w.text(`Not signed off: ${signed} of ${r.contexts.length} contexts signed off. This record is a draft.`, {
      size: 12,
      bold: true,
    });
  }
  const total = r.findCounts.reduce((s, c) => s + c.finds, 0);
  w.text(
    `${r.contexts.length} contexts (${signed} signed off) · ${total} finds · levels as reduced levels above ${r.site.datum}`,
  );
  if (r.trench.surfaceLevel !== null) w.text(`Ground surface before digging: ${r.trench.surfaceLevel.toFixed(3)} m RL`);
  w.text(`Written for the deposition package on ${formatWhen(r.exportedAt)}`, { size: 9, colour: SOFT });
  w.gap(10);

  w.text("Plan", { size: 14, bold: true });
  drawPlan(
    w,
    r.trench.outline,
    r.contexts.flatMap((c) => (c.extent ? [{ number: c.number, extent: c.extent }] : [])),
    r.findPoints,
  );

  w.gap(6);
  w.text("Context sheets", { size: 14, bold: true });
  for (const c of r.contexts) {
    w.gap(6);
    w.room(60);
    const state = c.signedOff
      ? `signed off by ${c.signedOff.by}, ${formatWhen(c.signedOff.at)}`
      : c.state === "awaiting"
        ? "awaiting sign-off"
        : "open, not signed off";
    w.text(`Context ${c.number} · ${c.type} · ${state}`, { size: 11, bold: true });
    for (const [label, value] of c.fields) if (value.trim()) w.text(`${label}: ${value}`, { indent: 12 });
    w.text(`relations: ${c.relations.join("; ") || "none recorded"}`, { indent: 12 });
  }

  w.gap(10);
  w.text("Finds by context and class", { size: 14, bold: true });
  if (!r.findCounts.length) w.text("No finds recorded in this trench.");
  else {
    w.row(
      [
        ["Context", 0],
        ["Class", 70],
        ["Finds", 400],
      ],
      { bold: true },
    );
    for (const f of r.findCounts)
      w.row([
        [String(f.context), 0],
        [`${f.classCode} ${f.classLabel}`, 70],
        [String(f.finds), 400],
      ]);
    w.row(
      [
        ["All", 0],
        ["", 70],
        [String(total), 400],
      ],
      { bold: true },
    );
  }

  const pages = doc.getPages();
  pages.forEach((page, i) =>
    page.drawText(`${r.site.code} trench ${r.trench.code} · page ${i + 1} of ${pages.length}`, {
      x: MARGIN,
      y: MARGIN - 20,
      size: 8,
      color: SOFT,
    }),
  );
  return doc.save();
}
