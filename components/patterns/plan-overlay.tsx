"use client";

import { useCallback, useMemo, useState } from "react";
import type { RunResult } from "@/lib/api/run-result";
import { testViews } from "@/lib/patterns-view/test-view";
import { AfterPaint } from "./after-paint";
import { PlotFrame } from "./plot-frame";

/** Cividis-like ramp (colour-blind safe: Nuñez, Anderton & Renslow 2018), sampled at 6 stops. */
const RAMP = ["#00224e", "#35456c", "#666970", "#948e77", "#c8b866", "#fee838"];
function ramp(t: number): string {
  const x = Math.max(0, Math.min(1, t)) * (RAMP.length - 1);
  const i = Math.min(RAMP.length - 2, Math.floor(x));
  const f = x - i;
  const hex = (s: string, k: number) => parseInt(s.slice(1 + 2 * k, 3 + 2 * k), 16);
  // i is clamped to 0 … RAMP.length − 2 above, so both stops exist.
  const [lo, hi] = [RAMP[i]!, RAMP[i + 1]!];
  const mix = (k: number) =>
    Math.round(hex(lo, k) * (1 - f) + hex(hi, k) * f)
      .toString(16)
      .padStart(2, "0");
  return `#${mix(0)}${mix(1)}${mix(2)}`;
}

/** Shades of the heat layer: cells are grouped by shade, one SVG path per shade. */
const SHADES = 48;
const n4 = (v: number) => Number(v.toFixed(4)); // 0.1 mm: plenty for a plan, and short path text

/**
 * The trench outline with one class's kernel density as a heat layer, the quadrat grid with counts, and
 * the finds. Drawn as plain SVG in site-grid metres, north up (y flipped for the screen). The heat layer
 * is a few paths (one per shade, its cells as squares) and the finds one path of circles, not thousands
 * of elements: the page stays quick to draw, and the exported SVG stays small.
 */
export function PlanOverlay({ result, runName }: { result: RunResult; runName: string }) {
  const withDensity = result.classes.filter((c) => result.density.some((d) => d.classId === c.id));
  const [classId, setClassId] = useState(withDensity[0]?.id ?? result.classes[0]?.id);
  const [showHeat, setShowHeat] = useState(true);
  const [showGrid, setShowGrid] = useState(true);
  const all = result.outline.flat();
  const xs = all.map((p) => p[0]),
    ys = all.map((p) => p[1]);
  const minX = Math.min(...xs),
    maxX = Math.max(...xs),
    minY = Math.min(...ys),
    maxY = Math.max(...ys);
  const span = Math.max(maxX - minX, maxY - minY);
  const pad = span * 0.04;
  const sy = useCallback((y: number) => maxY - y, [maxY]);
  const path = result.outline
    .map((ring) => "M" + ring.map(([x, y]) => `${x - minX},${sy(y)}`).join("L") + "Z")
    .join(" ");
  const density = result.density.find((d) => d.classId === classId);
  const peak = density ? Math.max(...density.values) : 1;
  const views = useMemo(() => testViews(result), [result]);
  const quadrat = views.find((t) => t.kind === "quadrat" && t.classId === classId);
  const cls = result.classes.find((c) => c.id === classId);
  const pts = result.finds.find((p) => p.classId === classId);
  const heat = useMemo(() => {
    if (!density) return [];
    const byShade: string[][] = Array.from({ length: SHADES }, () => []);
    const w = n4(density.dx * 1.02),
      h = n4(density.dy * 1.02);
    density.values.forEach((v, k) => {
      if (!(v > 0)) return;
      const x = n4(density.minX - minX + (k % density.nx) * density.dx);
      const y = n4(sy(density.minY + (Math.floor(k / density.nx) + 1) * density.dy));
      // A value off the scale (no finite peak) is left unshaded.
      byShade[Math.min(SHADES - 1, Math.round((v / peak) * (SHADES - 1)))]?.push(`M${x} ${y}h${w}v${h}h${-w}z`);
    });
    return byShade.flatMap((cells, shade) =>
      cells.length ? [{ shade, d: cells.join(""), fill: ramp(shade / (SHADES - 1)) }] : [],
    );
  }, [density, peak, minX, sy]);
  const finds = useMemo(() => {
    if (!pts) return "";
    const r = n4(span / 220);
    return pts.x
      .map((x, k) => {
        const y = pts.y[k];
        return y === undefined
          ? ""
          : `M${n4(x - minX - r)} ${n4(sy(y))}a${r} ${r} 0 1 0 ${2 * r} 0a${r} ${r} 0 1 0 ${-2 * r} 0`;
      })
      .join("");
  }, [pts, minX, sy, span]);
  const csv = () =>
    density
      ? density.values.map((v, k) => ({
          x: density.minX + ((k % density.nx) + 0.5) * density.dx,
          y: density.minY + (Math.floor(k / density.nx) + 0.5) * density.dy,
          intensity_per_m2: v,
        }))
      : [];
  return (
    <PlotFrame
      title={`Plan: ${cls?.code ?? ""} density${quadrat ? " and quadrat counts" : ""}`}
      name={`plan-${runName}-${cls?.code ?? "class"}`}
      csv={csv}
      caption={
        density
          ? `Heat: finds per m², ${density.rule}, bandwidth ${density.bandwidth.toFixed(2)} m. Peak ${peak.toFixed(1)} per m².`
          : undefined
      }
    >
      <div className="no-print mb-2 flex flex-wrap items-center gap-3 text-sm">
        <label className="flex items-center gap-2">
          <span className="label mb-0">Class</span>
          <select className="field w-auto" value={classId} onChange={(e) => setClassId(e.target.value)}>
            {result.classes.map((c) => (
              <option key={c.id} value={c.id}>
                {c.code} — {c.label}
              </option>
            ))}
          </select>
        </label>
        <label className="flex min-h-11 items-center gap-2">
          <input type="checkbox" checked={showHeat} onChange={(e) => setShowHeat(e.target.checked)} /> Heat layer
        </label>
        <label className="flex min-h-11 items-center gap-2">
          <input
            type="checkbox"
            checked={showGrid}
            onChange={(e) => setShowGrid(e.target.checked)}
            disabled={!quadrat}
          />{" "}
          Quadrat grid
        </label>
      </div>
      <AfterPaint
        box={{ width: "100%", maxHeight: 420, aspectRatio: `${maxX - minX + 2 * pad} / ${maxY - minY + 2 * pad}` }}
      >
        <svg
          viewBox={`${-pad} ${-pad} ${maxX - minX + 2 * pad} ${maxY - minY + 2 * pad}`}
          className="h-auto max-h-[420px] w-full"
          role="img"
          aria-label="Trench plan with the density of finds"
        >
          <defs>
            <clipPath id={`clip-${runName}`}>
              <path d={path} clipRule="evenodd" />
            </clipPath>
          </defs>
          <path d={path} fill="#efe6d3" fillRule="evenodd" />
          {showHeat && density && (
            <g clipPath={`url(#clip-${runName})`}>
              {heat.map((p) => (
                <path key={p.shade} d={p.d} fill={p.fill} />
              ))}
            </g>
          )}
          {showGrid && quadrat && quadrat.kind === "quadrat" && (
            <g clipPath={`url(#clip-${runName})`}>
              {quadrat.cells.map((c, k) => (
                <g key={k}>
                  <rect
                    x={c.x0 - minX}
                    y={sy(c.y1)}
                    width={c.x1 - c.x0}
                    height={c.y1 - c.y0}
                    fill="none"
                    stroke="#ffffff"
                    strokeWidth={span / 250}
                  />
                  <text
                    x={(c.x0 + c.x1) / 2 - minX}
                    y={sy((c.y0 + c.y1) / 2)}
                    fontSize={span / 32}
                    textAnchor="middle"
                    dominantBaseline="middle"
                    fill="#ffffff"
                    stroke="#2e2116"
                    strokeWidth={span / 700}
                    fontFamily="monospace"
                  >
                    {c.count}
                  </text>
                </g>
              ))}
            </g>
          )}
          {finds && cls && <path d={finds} fill={cls.colour} stroke="#2e2116" strokeWidth={span / 1200} />}
          <path d={path} fill="none" stroke="#2e2116" strokeWidth={span / 200} fillRule="evenodd" />
        </svg>
      </AfterPaint>
    </PlotFrame>
  );
}
