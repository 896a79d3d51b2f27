"use client";

import { useMemo, useRef, useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { apiClient, type ApiAnswer } from "@/lib/api/client";
import { exportPng, exportSvg } from "@/components/patterns/export-plot";
import { shadeCells } from "@/lib/squares/map-cells";
import { findCells, squareCells, type Measure } from "@/lib/squares/square-values";
import type { Classing } from "@/lib/squares/colour-classes";
import { GridSettings } from "./grid-settings";
import { SquareForm, type SquareFormClass, type SquareFormContext } from "./square-form";
import { SquareImport } from "./square-import";
import { SquareMap } from "./square-map";

type Data = ApiAnswer<"trenchSquares">;
type Find = { x: number; y: number; classId: string; contextId: string };

/**
 * Bulk finds counted by grid square, beside the trench plan: the squares map (count or density per class,
 * or the piece-plotted finds counted in the same squares), a tapped square's compact form, the CSV import
 * and the director's grid setting.
 */
export function SquaresPanel({
  siteId,
  trench,
  initial,
  classes,
  contexts,
  finds,
  canEdit,
  isDirector,
}: {
  siteId: string;
  trench: { id: string; code: string; outline: { coordinates: [number, number][][] } };
  initial: Data;
  classes: SquareFormClass[];
  contexts: SquareFormContext[];
  finds: Find[];
  canEdit: boolean;
  isDirector: boolean;
}) {
  const query = useQuery({
    queryKey: ["trench-squares", siteId, trench.id],
    queryFn: () => apiClient.call("trenchSquares", { siteId, trenchId: trench.id }),
    initialData: initial,
  });
  const data = query.data;
  const [classId, setClassId] = useState(classes[0]?.id ?? "");
  const [measure, setMeasure] = useState<Measure>("count");
  const [classing, setClassing] = useState<Classing>("quantile");
  const [source, setSource] = useState<"counts" | "finds">("counts");
  const [contextId, setContextId] = useState("");
  const [spitId, setSpitId] = useState("");
  const [showValues, setShowValues] = useState(true);
  const [tapped, setTapped] = useState<string | null>(null);
  const [said, setSaid] = useState("");
  const figure = useRef<HTMLDivElement>(null);
  const cls = classes.find((c) => c.id === classId);

  const shaded = useMemo(() => {
    if (!data.grid || !cls) return null;
    const scope = {
      classId,
      contextIds: contextId ? [contextId] : null,
      spitIds: spitId && source === "counts" ? [spitId] : null,
    };
    const cells =
      source === "finds"
        ? findCells(data.squares, data.grid, finds, scope)
        : squareCells(data.squares, data.samples, scope);
    return shadeCells(cells, {
      measure,
      classing,
      what: source === "finds" ? `${cls.code} piece-plotted finds` : `${cls.code} ${cls.label}`,
      showValues,
    });
  }, [data, cls, classId, contextId, spitId, source, finds, measure, classing, showValues]);
  // The spits squares were recorded in, within the chosen context: a map per spit as well as per context.
  const spitChoices = useMemo(() => {
    const seen = new Map<string, string>();
    for (const s of data.samples)
      if (s.spitId && (!contextId || s.contextId === contextId))
        seen.set(s.spitId, `${s.contextNumber} spit ${s.spitNumber}`);
    return [...seen.entries()].sort((a, b) => a[1].localeCompare(b[1], "en", { numeric: true }));
  }, [data.samples, contextId]);

  const square = tapped ? data.squares.find((s) => `${s.col},${s.row}` === tapped) : undefined;
  const outside = data.samples.filter((s) => s.outside);
  const name = `squares-${trench.code}-${cls?.code ?? "class"}-${measure}`;
  return (
    <section aria-labelledby="squares-h" className="sheet space-y-3" data-testid="squares-panel">
      <h2 id="squares-h" className="text-lg font-bold">
        Counts by square
      </h2>
      {!data.grid && (
        <p>
          This trench has no square grid yet.{" "}
          {isDirector
            ? "Set its square size and the grid lines it follows:"
            : "A director sets its square size and origin."}
        </p>
      )}
      {isDirector && (
        <GridSettings siteId={siteId} trenchId={trench.id} grid={data.grid} locked={data.samples.length > 0} />
      )}
      {data.grid && shaded && (
        <>
          <div className="flex flex-wrap items-end gap-3 text-sm">
            <label className="flex flex-col">
              <span className="label">Class</span>
              <select className="field w-auto" value={classId} onChange={(e) => setClassId(e.target.value)}>
                {classes.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.code} — {c.label}
                  </option>
                ))}
              </select>
            </label>
            <label className="flex flex-col">
              <span className="label">From</span>
              <select
                className="field w-auto"
                value={source}
                onChange={(e) => setSource(e.target.value as "counts" | "finds")}
              >
                <option value="counts">counts by square</option>
                <option value="finds">piece-plotted finds</option>
              </select>
            </label>
            <label className="flex flex-col">
              <span className="label">Context</span>
              <select
                className="field w-auto"
                value={contextId}
                onChange={(e) => {
                  setContextId(e.target.value);
                  setSpitId("");
                }}
              >
                <option value="">all</option>
                {contexts.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.number}
                  </option>
                ))}
              </select>
            </label>
            {source === "counts" && spitChoices.length > 0 && (
              <label className="flex flex-col">
                <span className="label">Spit</span>
                <select className="field w-auto" value={spitId} onChange={(e) => setSpitId(e.target.value)}>
                  <option value="">all</option>
                  {spitChoices.map(([id, name]) => (
                    <option key={id} value={id}>
                      {name}
                    </option>
                  ))}
                </select>
              </label>
            )}
            <label className="flex flex-col">
              <span className="label">Show</span>
              <select className="field w-auto" value={measure} onChange={(e) => setMeasure(e.target.value as Measure)}>
                <option value="count">count</option>
                <option value="density">density per excavated m²</option>
              </select>
            </label>
            <label className="flex flex-col">
              <span className="label">Classes</span>
              <select
                className="field w-auto"
                value={classing}
                onChange={(e) => setClassing(e.target.value as Classing)}
              >
                <option value="quantile">quantiles</option>
                <option value="equal">equal intervals</option>
              </select>
            </label>
            <label className="flex min-h-11 items-center gap-2">
              <input type="checkbox" checked={showValues} onChange={(e) => setShowValues(e.target.checked)} /> Numbers
            </label>
          </div>
          <p className="text-sm text-ink-soft">
            {canEdit && source === "counts"
              ? "Tap a square to enter or change its counts."
              : `${data.grid.size} m squares on lines through ${data.grid.originX} E, ${data.grid.originY} N.`}
          </p>
          <div className="grid gap-3 lg:grid-cols-[minmax(0,3fr)_minmax(18rem,2fr)]">
            <div ref={figure} className="max-w-3xl">
              <SquareMap
                id={`sq-${trench.code}`}
                outline={trench.outline.coordinates}
                cells={shaded.cells}
                legend={shaded.legend}
                selected={tapped}
                ariaLabel={`Trench ${trench.code}: ${shaded.legend.title}`}
                onCell={
                  canEdit && source === "counts"
                    ? (c) => {
                        setTapped(`${c.col},${c.row}`);
                        setSaid("");
                      }
                    : undefined
                }
              />
              <div className="no-print mt-1 flex gap-2">
                <button type="button" className="btn" onClick={() => figure.current && exportSvg(figure.current, name)}>
                  SVG
                </button>
                <button
                  type="button"
                  className="btn"
                  onClick={() => figure.current && void exportPng(figure.current, name)}
                >
                  PNG
                </button>
              </div>
            </div>
            <div>
              {square && canEdit ? (
                <SquareForm
                  key={tapped}
                  siteId={siteId}
                  trenchId={trench.id}
                  square={square}
                  samples={data.samples}
                  classes={classes}
                  contexts={contexts}
                  onDone={(m) => {
                    setSaid(m);
                    if (!m || m.includes("no longer")) setTapped(null);
                  }}
                />
              ) : null}
              <p role="status" aria-live="polite" className="text-ok">
                {said}
              </p>
              {outside.length > 0 && (
                <p className="text-warn">
                  {outside.length} square record(s) lie outside the outline as now drawn (
                  {outside
                    .slice(0, 5)
                    .map((s) => s.label)
                    .join(", ")}
                  ); they are kept but left out of maps and tests.
                </p>
              )}
            </div>
          </div>
          {canEdit && (
            <details>
              <summary className="cursor-pointer font-semibold">Import counts from a CSV file</summary>
              <SquareImport siteId={siteId} trenchId={trench.id} />
            </details>
          )}
        </>
      )}
    </section>
  );
}
