/**
 * What an exported square map holds: the SVG the page draws (and the SVG and PNG buttons save, PNG drawn
 * from this same SVG) marks each square with what it shows — its state, the value shaded and its class on
 * the scale, and a local test's finding — and keeps the legend inside the figure.
 */
import { describe, expect, it } from "vitest";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { SquareMap } from "@/components/squares/square-map";
import type { SquareTestView } from "@/lib/patterns-view/square-view";
import type { GridSquare } from "@/lib/geometry/square-grid";
import { shadeCells, type MapCell, type MapLegend } from "@/lib/squares/map-cells";
import { squareCells, type SampleLike } from "@/lib/squares/square-values";
import { testMapCells } from "@/lib/squares/test-map";

/** Four 1 m squares in a row, E0–E3 N0; the last is half outside the trench. */
const squares: GridSquare[] = [0, 1, 2, 3].map((col) => ({
  col,
  row: 0,
  label: `${col}/0`,
  x0: col,
  y0: 0,
  x1: col + 1,
  y1: 1,
  area: col === 3 ? 0.5 : 1,
  whole: col !== 3,
}));
const outline: [number, number][][] = [
  [
    [0, 0],
    [3.5, 0],
    [3.5, 1],
    [0, 1],
  ],
];

function draw(cells: MapCell[], legend: MapLegend): string {
  return renderToStaticMarkup(createElement(SquareMap, { id: "t", outline, cells, legend, ariaLabel: "test map" }));
}

/** Each square's <g>, as its data attributes. */
function squaresIn(svg: string): Record<string, Record<string, string>> {
  const out: Record<string, Record<string, string>> = {};
  for (const tag of svg.match(/<g [^>]*data-square="[^"]*"[^>]*>/g) ?? []) {
    const attrs = Object.fromEntries([...tag.matchAll(/data-([a-z-]+)="([^"]*)"/g)].map((m) => [m[1], m[2]]));
    out[attrs.square!] = attrs;
  }
  return out;
}

describe("the square map's SVG", () => {
  it("count map: each square says its state, its value and its class; the legend names the classing", () => {
    const sample = (col: number, count: number | null, area = 1): SampleLike => ({
      col,
      row: 0,
      contextId: "c1",
      spitId: null,
      area,
      outside: false,
      counts: count === null ? [] : [{ classId: "k", count, weightG: null }],
    });
    // E0: 2, E1: 0, E2: dug but the class not counted, E3: not dug.
    const cells = squareCells(squares, [sample(0, 2), sample(1, 0), sample(2, null)], { classId: "k" });
    const shaded = shadeCells(cells, { measure: "count", classing: "equal", what: "FLK" });
    const svg = draw(shaded.cells, shaded.legend);
    const g = squaresIn(svg);
    expect(g["0/0"]).toMatchObject({ kind: "value", value: "2", shade: "0" });
    expect(g["1/0"]).toMatchObject({ kind: "zero", value: "0" });
    expect(g["1/0"]!.shade).toBeUndefined();
    expect(g["2/0"]).toEqual({ square: "2/0", kind: "not-counted" });
    expect(g["3/0"]).toEqual({ square: "3/0", kind: "not-excavated" });
    expect(svg).toContain("equal-interval classes");
    expect(svg).toContain("not excavated (left out of tests)");
  });

  it("density map: the value is the count per excavated m²", () => {
    const cells = squareCells(
      squares,
      [
        {
          col: 3,
          row: 0,
          contextId: "c",
          spitId: null,
          area: 0.5,
          outside: false,
          counts: [{ classId: "k", count: 3, weightG: null }],
        },
        {
          col: 0,
          row: 0,
          contextId: "c",
          spitId: null,
          area: 1,
          outside: false,
          counts: [{ classId: "k", count: 3, weightG: null }],
        },
      ],
      { classId: "k" },
    );
    const shaded = shadeCells(cells, { measure: "density", classing: "quantile", what: "FLK" });
    const g = squaresIn(draw(shaded.cells, shaded.legend));
    expect(Number(g["3/0"]!.value)).toBe(6); // 3 in 0.5 m²
    expect(Number(g["0/0"]!.value)).toBe(3);
    expect(Number(g["3/0"]!.shade)).toBeGreaterThan(Number(g["0/0"]!.shade));
  });

  it("a run's local test: squares carry the tested value and their finding, outlined, named in the legend", () => {
    const cell = (col: number, value: number, cls: SquareTestView["cells"][number]["class"]) => ({
      label: `${col}/0`,
      x0: col,
      y0: 0,
      x1: col + 1,
      y1: 1,
      area: 1,
      value,
      statistic: 1,
      p: 0.001,
      pAdjusted: 0.004,
      class: cls,
    });
    const t = {
      kind: "getis-ord",
      variable: "count",
      cells: [cell(0, 40, "hot spot"), cell(1, 1, "none"), cell(2, 0, "cold spot")],
    } as SquareTestView;
    const { cells, legend } = testMapCells(t, "FLK");
    const svg = draw(cells, legend);
    const g = squaresIn(svg);
    expect(g["0/0"]).toMatchObject({ kind: "value", value: "40", spot: "hot spot" });
    expect(g["1/0"]!.spot).toBeUndefined();
    expect(g["2/0"]).toMatchObject({ kind: "zero", value: "0", spot: "cold spot" });
    expect(Object.keys(g)).toHaveLength(3); // squares not tested are not drawn
    // The hot spot's outline is red, the cold spot's blue and dashed; both named in the legend.
    expect(svg).toMatch(/data-spot="hot spot"[^]*?stroke="#b2182b"/);
    expect(svg).toMatch(/data-spot="cold spot"[^]*?stroke="#2166ac" stroke-width="[\d.]+" stroke-dasharray="[\d. ]+"/);
    expect(svg).toContain(">hot spot</text>");
    expect(svg).toContain(">cold spot</text>");
    expect(svg).toContain("outlines after the false-discovery-rate adjustment");
    expect(svg).toContain("p = 0.001, adjusted 0.004: hot spot");
  });
});
