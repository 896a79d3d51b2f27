import { describe, expect, it } from "vitest";
import config from "@/tailwind.config";
import {
  ACCENT,
  contrast,
  EXTENT,
  GRID_LINE,
  GRID_LINE_PHOTO,
  GRID_LINE_PHOTO_DARK,
  haloFor,
  INK,
  LABEL_BACK,
  over,
  PLAN_PAPER,
  TRENCH_FILL,
} from "@/components/plan/plan-colours";

/**
 * The plan is drawn on a canvas, which page checkers cannot read, so its colour pairs are checked here.
 * Thresholds from WCAG 2.2: 7:1 for text at level AAA (1.4.6), 3:1 for graphics needed to read the plan
 * (1.4.11). A photo can be any colour: a sweep of greys and a few soil tones stand for it.
 */
const theme = config.theme.extend.colors;
const PHOTOS = [
  ...Array.from({ length: 18 }, (_, i) => {
    const v = Math.round((i * 255) / 17)
      .toString(16)
      .padStart(2, "0");
    return `#${v}${v}${v}`;
  }),
  "#8a6a4a", // mid brown loam
  "#c9a56b", // pale sand
  "#4a3a2a", // dark humic soil
  "#a0522d", // red clay
];
const BACKS = [PLAN_PAPER, TRENCH_FILL];
/** The class colours of the demo site (scripts/seed/seed-demo.ts: the Okabe & Ito palette, and black). */
const DEMO_CLASSES = ["#0072b2", "#56b4e9", "#d55e00", "#009e73", "#cc79a7", "#000000"];

describe("the plan's colour pairs", () => {
  it("labels on the canvas reach 7:1 on paper and over any photo", () => {
    for (const back of [...BACKS, ...PHOTOS])
      expect(contrast(INK, over(LABEL_BACK, back)), `grid label over ${back}`).toBeGreaterThanOrEqual(7);
    expect(contrast("#ffffff", EXTENT), "context number on its extent colour").toBeGreaterThanOrEqual(7);
    // Vertex handles: accent rings on white.
    expect(contrast(ACCENT, "#ffffff")).toBeGreaterThanOrEqual(7);
  });

  it("the words over the plan (toolbar, hints, scale bar, messages) reach 7:1", () => {
    const paperOverPhoto = PHOTOS.map((p) => over(`${theme.paper.DEFAULT}f2`, p)); // bg-paper/95
    for (const back of [theme.paper.DEFAULT, theme.paper.deep, ...paperOverPhoto])
      expect(contrast(theme.ink.DEFAULT, back), `ink on ${back}`).toBeGreaterThanOrEqual(7);
    expect(contrast("#ffffff", theme.accent.DEFAULT), "primary button").toBeGreaterThanOrEqual(7);
    expect(contrast(theme.paper.DEFAULT, theme.ink.DEFAULT), "chosen tool").toBeGreaterThanOrEqual(7);
    expect(contrast(theme.ink.DEFAULT, theme.warn.light), "refusal message").toBeGreaterThanOrEqual(7);
    expect(contrast(theme.ink.DEFAULT, theme.ok.light), "saved message").toBeGreaterThanOrEqual(7);
  });

  it("grid lines stand out at 3:1 from the paper and the dug trench; over a photo one of the pair does", () => {
    for (const back of BACKS) expect(contrast(over(GRID_LINE, back), back), back).toBeGreaterThanOrEqual(3);
    for (const photo of PHOTOS) {
      const best = Math.max(
        contrast(over(GRID_LINE_PHOTO, photo), photo),
        contrast(over(GRID_LINE_PHOTO_DARK, photo), photo),
      );
      expect(best, `grid over ${photo}`).toBeGreaterThanOrEqual(3);
    }
  });

  it("every demo class symbol parts from its halo at 3:1, and the symbol stands out from the paper", () => {
    for (const colour of DEMO_CLASSES) {
      const halo = haloFor(colour);
      expect(contrast(colour, halo), `${colour} against its halo ${halo}`).toBeGreaterThanOrEqual(3);
      for (const back of BACKS)
        expect(Math.max(contrast(colour, back), contrast(halo, back)), `${colour} on ${back}`).toBeGreaterThanOrEqual(
          3,
        );
    }
  });

  it("so does any colour a site may give a class (600 colours, fixed seed)", () => {
    let s = 20261203;
    const next = () => (s = (Math.imul(s, 1103515245) + 12345) >>> 0) & 0xffffff;
    for (let i = 0; i < 600; i++) {
      const colour = `#${next().toString(16).padStart(6, "0")}`;
      const halo = haloFor(colour);
      expect(contrast(colour, halo), colour).toBeGreaterThanOrEqual(3);
      for (const back of BACKS)
        expect(Math.max(contrast(colour, back), contrast(halo, back)), `${colour} on ${back}`).toBeGreaterThanOrEqual(
          3,
        );
    }
  });
});
