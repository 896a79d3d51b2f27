"use client";

import type { QuadratView } from "@/lib/patterns-view/test-view";
import { SquareMap } from "@/components/squares/square-map";
import { classBreaks, classLabels, classOf, formatValue } from "@/lib/squares/colour-classes";
import type { MapCell } from "@/lib/squares/map-cells";
import { PlotFrame } from "./plot-frame";

/**
 * The quadrat test drawn where it was taken: each cell on the trench plan, clipped to the outline, shaded
 * by its observed count (viridis, quantile classes) and labelled "observed / expected", the expected count
 * being proportional to the cell's area inside the trench. Replaces the chart of counts by cell index.
 */
export function QuadratMap({ t, code, outline }: { t: QuadratView; code: string; outline: [number, number][][] }) {
  const scale = classBreaks(
    t.cells.map((c) => c.count),
    "quantile",
    5,
  );
  const labels = classLabels(scale);
  const cells: MapCell[] = t.cells.map((c, k) => {
    const base = {
      col: k,
      row: 0,
      label: `${formatValue(c.x0)}/${formatValue(c.y0)}`,
      x0: c.x0,
      y0: c.y0,
      x1: c.x1,
      y1: c.y1,
      text: `${c.count}/${+c.expected.toFixed(1)}`,
      title: `observed ${c.count}, expected ${formatValue(c.expected)}`,
    };
    if (c.count === 0) return { ...base, kind: "zero" };
    const i = classOf(scale, c.count);
    return { ...base, kind: "value", fill: scale.colours[i], dark: i < scale.colours.length / 2 };
  });
  const items = scale.colours.map((fill, i) => ({ kind: "value" as const, fill, label: `${labels[i]} observed` }));
  if (t.cells.some((c) => c.count === 0)) items.push({ kind: "value", fill: "#ffffff", label: "0 observed" });
  return (
    <PlotFrame
      title={`Quadrat counts on the plan, ${code}`}
      name={`quadrat-${code}`}
      csv={() =>
        t.cells.map((c, k) => ({
          cell: k + 1,
          x0: c.x0,
          y0: c.y0,
          x1: c.x1,
          y1: c.y1,
          observed: c.count,
          expected: c.expected,
        }))
      }
      caption={`Each cell: observed / expected finds; expected from the cell's area inside the trench. X² = ${t.X2.toFixed(2)}, df = ${t.df}, variance/mean = ${t.vmr.toFixed(2)}${t.monteCarlo ? "; small expected counts, p by Monte Carlo" : ""}.`}
    >
      <div className="max-w-2xl">
        <SquareMap
          id={`quadrat-${code}`}
          outline={outline}
          cells={cells}
          ariaLabel={`Quadrat counts of ${code} on the trench plan, observed and expected per cell`}
          legend={{
            title: `${code}: finds per quadrat`,
            note: "in each cell: observed/expected",
            items,
          }}
        />
      </div>
    </PlotFrame>
  );
}
