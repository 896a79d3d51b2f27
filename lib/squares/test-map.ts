import type { SquareCellView, SquareTestView } from "@/lib/patterns-view/square-view";
import { classBreaks, classingWords, classLabels, classOf, formatValue } from "./colour-classes";
import type { MapCell, MapLegend, SpotLine } from "./map-cells";

/**
 * A square-count test's result drawn on the plan like the count maps: the tested variable in viridis
 * quantile classes, and the squares a local test marks after the false-discovery-rate adjustment
 * outlined (red for hot, blue dashed for cold, dotted for a square unlike its neighbours).
 */
export const SPOT_LINES: Record<Exclude<SquareCellView["class"], "none">, SpotLine> = {
  "hot spot": { stroke: "#b2182b" },
  "cold spot": { stroke: "#2166ac", dash: "4 2" },
  "high among low": { stroke: "#b2182b", dash: "1 2" },
  "low among high": { stroke: "#2166ac", dash: "1 2" },
};

const p3 = (p: number) => (p < 0.001 ? "< 0.001" : p.toFixed(3));

export function testMapCells(t: SquareTestView, code: string): { cells: MapCell[]; legend: MapLegend } {
  const unit = t.variable === "density" ? `${code} per m²` : `${code} count`;
  const scale = classBreaks(
    t.cells.map((c) => c.value),
    "quantile",
    5,
  );
  const labels = classLabels(scale);
  const cells = t.cells.map((c, k): MapCell => {
    const tested = c.p !== null && c.pAdjusted !== null ? `, p = ${p3(c.p)}, adjusted ${p3(c.pAdjusted)}` : "";
    const base = {
      col: k,
      row: 0,
      label: c.label,
      x0: c.x0,
      y0: c.y0,
      x1: c.x1,
      y1: c.y1,
      value: c.value,
      spot: c.class === "none" ? undefined : c.class,
      title: `${formatValue(c.value)} ${unit}${tested}${c.class !== "none" ? `: ${c.class}` : ""}`,
    };
    if (!(c.value > 0)) return { ...base, kind: "zero" };
    const i = classOf(scale, c.value);
    return { ...base, kind: "value", fill: scale.colours[i], dark: i < scale.colours.length / 2, shade: i };
  });
  const items: MapLegend["items"] = scale.colours.map((fill, i) => ({
    kind: "value",
    fill,
    label: `${labels[i]} ${t.variable === "density" ? "per m²" : ""}`.trim(),
  }));
  if (cells.some((c) => c.kind === "zero")) items.push({ kind: "zero", label: "0 (counted, none found)" });
  for (const [name, line] of Object.entries(SPOT_LINES))
    if (cells.some((c) => c.spot === name)) items.push({ kind: "zero", label: name, line });
  return {
    cells,
    legend: {
      title: `${code}: ${t.variable === "density" ? "count per excavated m²" : "count per square"}, as tested`,
      note: `${scale.colours.length} ${classingWords.quantile}; viridis scale; squares not tested not drawn${t.kind === "local-moran" || t.kind === "getis-ord" ? "; outlines after the false-discovery-rate adjustment" : ""}`,
      items,
    },
  };
}
