import { z } from "zod";
import { numeric } from "@/lib/schemas/common";

/** An A4 sheet, portrait, in millimetres: what every label layout is laid on. */
export const A4 = { widthMm: 210, heightMm: 297 } as const;

export type LabelLayout = {
  columns: number;
  rows: number;
  widthMm: number;
  heightMm: number;
  topMm: number;
  leftMm: number;
  gapXMm: number;
  gapYMm: number;
};

/**
 * A few common A4 sheets of adhesive labels, by how many labels a sheet holds and their size (measured from
 * the sheets; any other layout can be typed in).
 */
export const labelPresets = {
  "21": {
    name: "21 a sheet: 3 × 7, 63.5 × 38.1 mm (bags)",
    layout: { columns: 3, rows: 7, widthMm: 63.5, heightMm: 38.1, topMm: 15.15, leftMm: 7.25, gapXMm: 2.5, gapYMm: 0 },
  },
  "14": {
    name: "14 a sheet: 2 × 7, 99.1 × 38.1 mm (bags)",
    layout: { columns: 2, rows: 7, widthMm: 99.1, heightMm: 38.1, topMm: 15.15, leftMm: 4.65, gapXMm: 2.5, gapYMm: 0 },
  },
  "24": {
    name: "24 a sheet: 3 × 8, 70 × 37 mm (bags, edge to edge)",
    layout: { columns: 3, rows: 8, widthMm: 70, heightMm: 37, topMm: 0.5, leftMm: 0, gapXMm: 0, gapYMm: 0 },
  },
  "40": {
    name: "40 a sheet: 4 × 10, 48.5 × 25.4 mm (small bags)",
    layout: { columns: 4, rows: 10, widthMm: 48.5, heightMm: 25.4, topMm: 21.5, leftMm: 8, gapXMm: 0, gapYMm: 0 },
  },
  "8": {
    name: "8 a sheet: 2 × 4, 99.1 × 67.7 mm (boxes)",
    layout: { columns: 2, rows: 4, widthMm: 99.1, heightMm: 67.7, topMm: 13.1, leftMm: 4.65, gapXMm: 2.5, gapYMm: 0 },
  },
} as const satisfies Record<string, { name: string; layout: LabelLayout }>;
export type LabelPreset = keyof typeof labelPresets;
export const presetKeys = Object.keys(labelPresets) as LabelPreset[];

const mm = (what: string, min: number, max: number) =>
  numeric(
    z
      .number({ error: `Give the ${what} in millimetres.` })
      .min(min, `The ${what} is at least ${min} mm.`)
      .max(max, `The ${what} is at most ${max} mm.`),
  ).optional();
const count = (what: string, max: number) =>
  numeric(
    z
      .number({ error: `Give the number of ${what}.` })
      .int(`The number of ${what} is a whole number.`)
      .min(1, `At least 1 ${what.slice(0, -1)}.`)
      .max(max, `At most ${max} ${what}.`),
  ).optional();

/**
 * The layout as the labels page's form sends it: a preset, each measure overriding it. The whole must fit
 * on A4 and leave room for a readable code (a label at least 25 × 15 mm).
 */
export const layoutQuery = z
  .object({
    preset: z
      .enum(presetKeys as [LabelPreset, ...LabelPreset[]], { error: "Pick one of the sheets listed." })
      .default("21"),
    columns: count("columns", 10),
    rows: count("rows", 30),
    widthMm: mm("label width", 25, 210),
    heightMm: mm("label height", 15, 297),
    topMm: mm("top margin", 0, 100),
    leftMm: mm("left margin", 0, 100),
    gapXMm: mm("gap between columns", 0, 50),
    gapYMm: mm("gap between rows", 0, 50),
  })
  .transform(({ preset, ...given }) => {
    const layout: LabelLayout = { ...labelPresets[preset].layout };
    for (const [k, v] of Object.entries(given)) if (v !== undefined) layout[k as keyof LabelLayout] = v;
    return { preset, layout };
  })
  .superRefine(({ layout: l }, ctx) => {
    const w = l.leftMm + l.columns * l.widthMm + (l.columns - 1) * l.gapXMm;
    const h = l.topMm + l.rows * l.heightMm + (l.rows - 1) * l.gapYMm;
    if (w > A4.widthMm + 0.01)
      ctx.addIssue({
        code: "custom",
        path: ["widthMm"],
        message: `The labels reach ${w.toFixed(1)} mm across; an A4 sheet is ${A4.widthMm} mm wide.`,
      });
    if (h > A4.heightMm + 0.01)
      ctx.addIssue({
        code: "custom",
        path: ["heightMm"],
        message: `The labels reach ${h.toFixed(1)} mm down; an A4 sheet is ${A4.heightMm} mm high.`,
      });
  });

/** Where label `i` of a sheet sits (row by row from the top left), in millimetres from the sheet's corner. */
export function labelPosition(l: LabelLayout, i: number): { x: number; y: number } {
  const col = i % l.columns;
  const row = Math.floor(i / l.columns) % l.rows;
  return { x: l.leftMm + col * (l.widthMm + l.gapXMm), y: l.topMm + row * (l.heightMm + l.gapYMm) };
}

export const perSheet = (l: LabelLayout) => l.columns * l.rows;
