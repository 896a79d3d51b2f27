import type { TrenchSquares } from "@/lib/server/squares";
import { shadeCells } from "@/lib/squares/map-cells";
import { squareCells } from "@/lib/squares/square-values";
import { SquareMap } from "./square-map";

/**
 * Counts by square as the trench record prints them: for each class counted in any square, its count per
 * square over all contexts and spits, in quantile classes; then the records as a table.
 */
export function SquareMapsPrint({
  trenchCode,
  outline,
  data,
  classes,
}: {
  trenchCode: string;
  outline: [number, number][][];
  data: TrenchSquares;
  classes: { id: string; code: string; label: string }[];
}) {
  if (!data.grid || !data.samples.length) return null;
  const counted = classes.filter((c) => data.samples.some((s) => s.counts.some((k) => k.classId === c.id)));
  const code = new Map(classes.map((c) => [c.id, c.code]));
  return (
    <section className="report-section" aria-labelledby="squares-print-h">
      <h2 id="squares-print-h" className="text-2xl font-bold">
        Counts by square
      </h2>
      <p className="text-sm">
        {data.grid.size} m squares on grid lines through {data.grid.originX} E, {data.grid.originY} N;{" "}
        {data.samples.length} square records.
      </p>
      <div className="grid gap-4 sm:grid-cols-2">
        {counted.map((c) => {
          const shaded = shadeCells(squareCells(data.squares, data.samples, { classId: c.id }), {
            measure: "count",
            classing: "quantile",
            what: `${c.code} ${c.label}`,
            showValues: true,
          });
          return (
            <figure key={c.id} className="sheet" aria-label={`Counts by square, ${c.code}`}>
              <SquareMap
                id={`print-${trenchCode}-${c.code}`}
                outline={outline}
                cells={shaded.cells}
                legend={shaded.legend}
                ariaLabel={`Trench ${trenchCode}: ${shaded.legend.title}`}
              />
            </figure>
          );
        })}
      </div>
      <table className="ledger mt-3 text-xs" aria-label="Square records">
        <thead>
          <tr>
            <th>Square</th>
            <th>Context</th>
            <th>Spit</th>
            <th className="num">Area dug (m²)</th>
            <th>Counts (weight g)</th>
          </tr>
        </thead>
        <tbody>
          {data.samples.map((s) => (
            <tr key={s.id}>
              <td className="num">
                {s.label}
                {s.outside ? " (outside the outline)" : ""}
              </td>
              <td className="num">{s.contextNumber}</td>
              <td className="num">{s.spitNumber ?? "—"}</td>
              <td className="num">{+s.area.toFixed(4)}</td>
              <td>
                {s.counts
                  .map((k) => `${code.get(k.classId) ?? "?"} ${k.count}${k.weightG != null ? ` (${k.weightG})` : ""}`)
                  .join(", ")}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
