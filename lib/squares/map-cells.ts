import { classBreaks, classingWords, classLabels, classOf, formatValue, type Classing } from "./colour-classes";
import { cellValue, measureWords, type Measure, type SquareCell } from "./square-values";

/** How a square is drawn: shaded by its class, 0 (counted, none found), or left plain. */
export type MapCell = Pick<SquareCell, "col" | "row" | "label" | "x0" | "y0" | "x1" | "y1"> & {
  kind: "value" | "zero" | "not-counted" | "not-excavated";
  fill?: string;
  /** Dark fill: write the cell's text in white. */
  dark?: boolean;
  text?: string;
  title: string;
  /** The number shaded (count, density, or a test's variable), and its class on the scale (0 = lowest). */
  value?: number;
  shade?: number;
  /** A local test's finding in this square ("hot spot", "cold spot", …), drawn as an outline. */
  spot?: string;
};

/** How a square marked by a local test is outlined. */
export type SpotLine = { stroke: string; dash?: string };

export type MapLegend = {
  title: string;
  note?: string;
  items: { kind: MapCell["kind"]; fill?: string; label: string; line?: SpotLine }[];
};

const unit: Record<Measure, string> = { count: "", density: " per m²" };

/**
 * Shades one class's squares: values above 0 in viridis classes (quantile or equal interval, said in the
 * legend), 0, not counted and not excavated each drawn their own way and named in the legend.
 */
export function shadeCells(
  cells: readonly SquareCell[],
  opts: { measure: Measure; classing: Classing; classes?: number; what: string; showValues?: boolean },
): { cells: MapCell[]; legend: MapLegend } {
  const values = cells.map((c) => cellValue(c, opts.measure));
  const scale = classBreaks(
    values.filter((v): v is number => v !== null),
    opts.classing,
    opts.classes ?? 5,
  );
  const labels = classLabels(scale);
  const out = cells.map((c, i): MapCell => {
    const v = values[i]!;
    const base = { col: c.col, row: c.row, label: c.label, x0: c.x0, y0: c.y0, x1: c.x1, y1: c.y1 };
    if (c.state === "not-excavated") return { ...base, kind: "not-excavated", title: "not excavated" };
    if (c.state === "not-counted" || v === null)
      return { ...base, kind: "not-counted", title: `dug, ${opts.what} not counted` };
    const title = `${c.count} ${opts.what}${opts.measure === "density" ? ` in ${formatValue(c.excavated)} m² (${formatValue(v)} per m²)` : ""}`;
    if (v === 0) return { ...base, kind: "zero", title, value: 0, text: opts.showValues ? "0" : undefined };
    const k = classOf(scale, v);
    return {
      ...base,
      kind: "value",
      value: v,
      shade: k,
      fill: scale.colours[k],
      dark: k < scale.colours.length / 2,
      title,
      text: opts.showValues ? formatValue(v) : undefined,
    };
  });
  const present = new Set(out.map((c) => c.kind));
  const items: MapLegend["items"] = scale.colours.map((fill, i) => ({
    kind: "value" as const,
    fill,
    label: `${labels[i]}${unit[opts.measure]}`,
  }));
  if (present.has("zero")) items.push({ kind: "zero", label: "0 (counted, none found)" });
  if (present.has("not-counted")) items.push({ kind: "not-counted", label: `dug, ${opts.what} not counted` });
  if (present.has("not-excavated")) items.push({ kind: "not-excavated", label: "not excavated (left out of tests)" });
  const note = scale.colours.length
    ? `${scale.colours.length} ${classingWords[opts.classing]}; viridis scale`
    : "nothing above 0 to shade";
  return { cells: out, legend: { title: `${opts.what}: ${measureWords[opts.measure]}`, note, items } };
}
