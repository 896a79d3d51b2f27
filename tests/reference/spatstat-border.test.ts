/**
 * The border-corrected K where it is undefined, against spatstat (fixtures/border-undefined.json, written by
 * make-fixtures-border.R): on a grid reaching 1.5 times the deepest point's boundary distance, spatstat
 * gives K wherever some point lies at least the previous grid value from the edge and NA beyond. The engine
 * must give the same values where K is defined and NaN exactly where spatstat has NA, in a polygon (generic
 * binning) and in a rectangle (spatstat's Krect rule).
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { createWindow, kFunction, lFunction } from "@/lib/spatial";
import { expectClose, type Pair } from "./fixture";

interface BorderCase {
  source: string;
  windowType: string;
  window: { outer: Pair[]; holes: Pair[][] };
  points: { x: number[]; y: number[] };
  deepest: number;
  r: number[];
  border: (number | null)[];
  call: string;
}
const file = "border-undefined.json";
const fx = JSON.parse(readFileSync(path.join(__dirname, "fixtures", file), "utf8")) as {
  meta: { R: string; packages: Record<string, string> };
  cases: Record<string, BorderCase>;
};
const label = (c: BorderCase) =>
  `spatstat ${fx.meta.packages.spatstat} / spatstat.explore ${fx.meta.packages["spatstat.explore"]} (${fx.meta.R}), ${file}, ${c.call}`;

describe("border correction beyond the deepest point (spatstat's NA)", () => {
  for (const [name, c] of Object.entries(fx.cases)) {
    it(`${name} (${c.windowType}, from ${c.source}): defined where spatstat is, equal there, NaN beyond`, () => {
      const W = createWindow({ outer: c.window.outer, holes: c.window.holes });
      const K = kFunction(W, c.points, { r: c.r, correction: "border" }).K.border!;
      const L = lFunction(W, c.points, { r: c.r, correction: "border" }).L.border!;
      const definedInR = c.border.map((v) => v !== null);
      expect(definedInR.filter(Boolean).length, label(c)).toBeLessThan(c.r.length); // the grid does reach beyond
      expect(
        Array.from(K, (v) => Number.isFinite(v)),
        label(c),
      ).toEqual(definedInR);
      expect(
        Array.from(L, (v) => Number.isFinite(v)),
        label(c),
      ).toEqual(definedInR);
      for (let k = 0; k < c.r.length; k++) {
        const e = c.border[k];
        if (e === null) continue;
        expectClose(K[k], e, `${label(c)} at r = ${c.r[k]}`, 1e-9);
        expectClose(L[k], Math.sqrt(e / Math.PI), `${label(c)}, L at r = ${c.r[k]}`, 1e-9);
      }
    });
  }
});
