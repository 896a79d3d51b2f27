import { describe, expect, it } from "vitest";
import { symbolPath, type SymbolShape } from "@/lib/geometry/symbol-paths";
import type { TrenchRecord } from "@/lib/server/export/trench-record-data";
import { FIND_SYMBOL_R, FINDS_TAG, trenchRecordPdf } from "@/lib/server/export/trench-record-pdf";
import { markedPaths, pdfContent } from "../support/pdf-content";
import { pdfText } from "../support/pdf-text";

/**
 * The trench record's plan draws every find as its class's symbol in its class's colour, one filled path per
 * class, with a key; read back from the PDF's own content stream.
 */

/** A fixed-seed generator (a linear congruential one, common practice), so the finds are the same each run. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

const classes = [
  { classCode: "BN", classLabel: "Bone", colour: "#0000aa", symbol: "triangle", n: 500 },
  { classCode: "FL", classLabel: "Flint", colour: "#aa0000", symbol: "disc", n: 3000 },
  { classCode: "PO", classLabel: "Pottery", colour: "#00aa00", symbol: "square", n: 1500 },
] as const;

function record(): TrenchRecord {
  const rand = lcg(15);
  const square = {
    type: "Polygon" as const,
    coordinates: [
      [
        [0, 0],
        [10, 0],
        [10, 8],
        [0, 8],
        [0, 0],
      ],
    ],
  };
  return {
    site: { code: "TST", name: "Test site", datum: "site datum" },
    trench: { code: "A", name: "", outline: square as TrenchRecord["trench"]["outline"], surfaceLevel: null },
    signOff: null,
    contexts: [],
    findCounts: [],
    findPoints: classes.map((c) => ({
      classCode: c.classCode,
      classLabel: c.classLabel,
      colour: c.colour,
      symbol: c.symbol,
      x: Float64Array.from({ length: c.n }, () => 0.2 + rand() * 9.6),
      y: Float64Array.from({ length: c.n }, () => 0.2 + rand() * 7.6),
    })),
    exportedAt: new Date("2026-07-14T09:30:00Z"),
  };
}

/** Where a symbol's path starts in its unit box (its first "M"), in PDF axes (y up). */
function firstPoint(symbol: string): [number, number] {
  const m = /^M\s+(-?[\d.]+)\s+(-?[\d.]+)/.exec(symbolPath[symbol as SymbolShape])!;
  return [Number(m[1]), -Number(m[2])];
}

describe("the trench record's plan", () => {
  it("draws every find at its place as its class's symbol and colour, one filled path per class", async () => {
    const r = record();
    const bytes = await trenchRecordPdf(r);
    const [page] = await pdfContent(bytes);
    const blocks = markedPaths(page!, FINDS_TAG);
    expect(blocks).toHaveLength(classes.length);

    // The trench outline (its 1.4 pt lines) frames the grid: 0..10 m east, 0..8 m north.
    const outline = [...page!.matchAll(/1\.4 w[\s\S]*?S/g)].flatMap((m) =>
      [...m[0].matchAll(/(-?[\d.]+)\s+(-?[\d.]+)\s+[ml]\b/g)].map((p) => [Number(p[1]), Number(p[2])]),
    );
    const [x0, x1] = [Math.min(...outline.map((p) => p[0]!)), Math.max(...outline.map((p) => p[0]!))];
    const [y0, y1] = [Math.min(...outline.map((p) => p[1]!)), Math.max(...outline.map((p) => p[1]!))];
    const k = (x1 - x0) / 10;
    expect((y1 - y0) / 8).toBeCloseTo(k, 6);

    classes.forEach((c, i) => {
      const block = blocks[i]!;
      const pts = r.findPoints[i]!;
      expect(block.fill.map((v) => Math.round(v * 255))).toEqual([
        parseInt(c.colour.slice(1, 3), 16),
        parseInt(c.colour.slice(3, 5), 16),
        parseInt(c.colour.slice(5, 7), 16),
      ]);
      expect(block.fills, `${c.classCode}: one fill for the whole class`).toBe(1);
      const moves = block.ops.filter((o) => o.op === "m");
      expect(moves).toHaveLength(c.n);
      // Each symbol's first point, moved back by its offset in the unit box and read on the grid, is the find
      // (drawn in the order given).
      const [ox, oy] = firstPoint(c.symbol);
      const drawn = moves.map((m) => [
        (m.args[0]! - ox * FIND_SYMBOL_R - x0) / k,
        (m.args[1]! - oy * FIND_SYMBOL_R - y0) / k,
      ]);
      let worst = 0;
      drawn.forEach(([x, y], j) => {
        worst = Math.max(worst, Math.abs(x! - pts.x[j]!), Math.abs(y! - pts.y[j]!));
      });
      // Two decimals of a point, at about 41 points a metre: well under a millimetre.
      expect(worst).toBeLessThan(0.001);
    });

    const { pages } = await pdfText(bytes);
    expect(pages[0]).toContain("Key to the finds on the plan");
    for (const c of classes) expect(pages.join("\n")).toContain(`${c.classCode} ${c.classLabel}: ${c.n} finds`);
  });

  it("stays small with thousands of finds: tens of bytes a find", async () => {
    const base = await trenchRecordPdf({ ...record(), findPoints: [] });
    const full = await trenchRecordPdf(record());
    const perFind = (full.length - base.length) / 5000;
    // Measured here: about 42 bytes a find (5,000 finds add some 210 kB); drawn one by one with their own
    // graphics state they would cost several times that.
    expect(perFind).toBeGreaterThan(10);
    expect(perFind).toBeLessThan(60);
  });
});
