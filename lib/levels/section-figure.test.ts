import { describe, expect, it } from "vitest";
import { buildSectionFigure, niceStep, sectionCsvRows, sectionSvg, type SectionFind } from "./section-figure";

const find = (number: number, x: number, y: number, z: number | null, contextNumber = 10): SectionFind => ({
  number,
  x,
  y,
  z,
  contextNumber,
  classCode: "FL",
  colour: "#aa3300",
  symbol: "triangle",
});

/** A line along the x axis, 10 m long, band 0.5 m either side; positions chosen so the answers are by eye. */
const line = { start: [0, 0] as const, end: [10, 0] as const, halfWidth: 0.5 };
const finds = [
  find(1, 2, 0.3, 49.5),
  find(2, 3, -0.6, 49.4),
  find(3, 11, 0, 49.3),
  find(4, 5, 0.2, null),
  find(5, 7, -0.5, 49.2),
  find(6, 4, 0.1, 49.35, 11),
];
const contexts = [
  { number: 10, top: 49.6, base: 49.1 },
  { number: 11, top: null, base: null },
  { number: 12, top: 49.0, base: 48.0 },
];

const drawn = (svg: string) => [...svg.matchAll(/data-find="(\d+)"/g)].map((m) => Number(m[1]));
const at = (svg: string, n: number) => {
  const m = new RegExp(`data-find="${n}"[^>]*translate\\(([-\\d.]+) ([-\\d.]+)\\)`).exec(svg)!;
  return [Number(m[1]), Number(m[2])];
};

describe("buildSectionFigure", () => {
  it("keeps the finds inside the band and between the ends, counts those without a level", () => {
    const fig = buildSectionFigure("S1", line, 2, finds, contexts);
    expect(fig.finds.map((f) => f.number)).toEqual([1, 6, 5]);
    expect(fig.finds.map((f) => f.along)).toEqual([2, 4, 7]);
    expect(fig.withoutLevel).toEqual([4]);
    // Context 10 has levels and finds in the band: drawn from 0.1 m before its first find to 0.1 m after its last.
    expect(fig.horizons).toEqual([{ contextNumber: 10, top: 49.6, base: 49.1, from: 1.9, to: 7.1 }]);
  });

  it("refuses an exaggeration that is not above 0", () => {
    expect(() => buildSectionFigure("S1", line, 0, finds, contexts)).toThrow(/exaggeration/);
  });
});

describe("sectionSvg", () => {
  it("draws each projected find with its number, and the vertical exaggeration as asked", () => {
    for (const ve of [1, 2.5, 10]) {
      const fig = buildSectionFigure("S1", line, ve, finds, contexts);
      const svg = sectionSvg(fig, { title: "Trench A section S1", datumName: "Site datum" });
      expect(drawn(svg)).toEqual([1, 6, 5]);
      const [x1, y1] = at(svg, 1);
      const [x5, y5] = at(svg, 5);
      // 5 m across and 0.3 m down between finds 1 and 5: the pixels per metre up are ve × those across.
      const perAcross = (x5! - x1!) / 5;
      const perUp = (y5! - y1!) / 0.3;
      expect(perUp / perAcross).toBeCloseTo(ve, 2);
      expect(svg).toContain(`vertical exaggeration ×${ve}`);
      expect(svg).toContain("Band ±0.50 m");
      expect(svg).toContain('data-horizon="10" data-kind="top"');
      expect(svg).toContain("1 find(s) in the band have no level and are not drawn: 4.");
    }
  });

  it("escapes names and refuses to carry a colour that is not a colour", () => {
    const fig = buildSectionFigure("<S&1>", line, 1, [{ ...find(1, 2, 0, 49), colour: 'red" onload="x' }], []);
    const svg = sectionSvg(fig, { title: "A <b>", datumName: "OD & co" });
    expect(svg).not.toContain("<b>");
    expect(svg).toContain("A &lt;b&gt;");
    expect(svg).toContain('data-section="&lt;S&amp;1&gt;"');
    expect(svg).not.toContain("onload");
    expect(svg).toContain("m above OD &amp; co");
  });
});

describe("sectionCsvRows and niceStep", () => {
  it("lists the drawn finds with their position along and off the line and their RL", () => {
    const rows = sectionCsvRows(buildSectionFigure("S1", line, 1, finds, contexts));
    expect(rows[0]).toEqual({ number: 1, context: 10, class: "FL", along_m: 2, offset_m: 0.3, z_rl_m: 49.5 });
    expect(rows.map((r) => r.offset_m)).toEqual([0.3, 0.1, -0.5]);
  });
  it("picks ticks of 1, 2 or 5 times a power of ten", () => {
    expect(niceStep(10, 8)).toBe(2);
    expect(niceStep(0.5, 5)).toBeCloseTo(0.1, 12);
    expect(niceStep(37, 4)).toBe(10);
  });
});
