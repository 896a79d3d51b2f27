import type { PolygonJson } from "@/lib/server/reads/row-types";
import { boundsOf } from "@/lib/geometry/plan-view";
import { symbolPath, type SymbolShape } from "@/lib/geometry/symbol-paths";

export type PlanPoint = { x: number; y: number; symbol: string; colour: string; label: string };

/** Grid spacing of 1, 2 or 5 × 10^k metres giving about 4–10 lines across the span. */
function gridStep(span: number): number {
  const raw = span / 8;
  const pow = 10 ** Math.floor(Math.log10(raw));
  const m = raw / pow;
  return (m < 1.5 ? 1 : m < 3.5 ? 2 : 5) * pow;
}

/**
 * The printed plan: trench outline (holes left blank), site-grid lines with metre labels, each find drawn
 * with its class symbol and colour, a scale bar and a north arrow (site-grid north is up). Plain SVG in
 * site-grid metres, so it prints sharp at any size.
 */
export function PlanFigure({
  outline,
  points,
  width = 680,
}: {
  outline: PolygonJson;
  points: PlanPoint[];
  width?: number;
}) {
  const { minX, maxX, minY, maxY } = boundsOf(outline.coordinates.flat());
  const span = Math.max(maxX - minX, maxY - minY) || 1;
  const pad = span * 0.12;
  const vx = minX - pad,
    vy = -(maxY + pad),
    vw = maxX - minX + 2 * pad,
    vh = maxY - minY + 2 * pad;
  const step = gridStep(span);
  const lines: [number, 0 | 1][] = [];
  for (let x = Math.ceil(vx / step) * step; x <= vx + vw; x += step) lines.push([x, 0]);
  for (let y = Math.ceil((minY - pad) / step) * step; y <= maxY + pad; y += step) lines.push([y, 1]);
  const d = outline.coordinates
    .map((ring) => "M" + ring.map(([x, y]) => `${x.toFixed(3)},${(-y).toFixed(3)}`).join("L") + "Z")
    .join(" ");
  const r = span / 90;
  const font = span / 45;
  const bar = step;
  return (
    <svg
      viewBox={`${vx} ${vy} ${vw} ${vh}`}
      width={width}
      height={(width * vh) / vw}
      role="img"
      aria-label="Plan of the trench with its finds"
      className="max-w-full"
    >
      <rect x={vx} y={vy} width={vw} height={vh} fill="#ffffff" />
      {lines.map(([v, axis]) =>
        axis === 0 ? (
          <g key={`x${v}`}>
            <line x1={v} x2={v} y1={vy} y2={vy + vh} stroke="#d9ccb1" strokeWidth={span / 600} />
            <text
              x={v}
              y={vy + vh - font * 0.4}
              fontSize={font}
              textAnchor="middle"
              fill="#5a4632"
              fontFamily="monospace"
            >
              {+v.toFixed(3)}
            </text>
          </g>
        ) : (
          <g key={`y${v}`}>
            <line x1={vx} x2={vx + vw} y1={-v} y2={-v} stroke="#d9ccb1" strokeWidth={span / 600} />
            <text x={vx + font * 0.3} y={-v - font * 0.2} fontSize={font} fill="#5a4632" fontFamily="monospace">
              {+v.toFixed(3)}
            </text>
          </g>
        ),
      )}
      <path d={d} fill="#efe6d3" fillRule="evenodd" stroke="#2e2116" strokeWidth={span / 250} />
      {points.map((p, i) => (
        <path
          key={i}
          d={symbolPath[p.symbol as SymbolShape] ?? symbolPath.disc}
          transform={`translate(${p.x} ${-p.y}) scale(${r})`}
          fill={p.colour}
          fillRule="evenodd"
          stroke="#2e2116"
          strokeWidth={0.18}
        >
          <title>{p.label}</title>
        </path>
      ))}
      <g transform={`translate(${vx + vw - pad * 0.5} ${vy + pad * 0.3})`} aria-label="North arrow">
        <path d={`M0,0 L${font * 0.6},${font * 2} L0,${font * 1.5} L${-font * 0.6},${font * 2} Z`} fill="#2e2116" />
        <text x={0} y={font * 3.1} fontSize={font} textAnchor="middle" fill="#2e2116">
          N
        </text>
      </g>
      <g transform={`translate(${minX} ${-(minY - pad * 0.55)})`} aria-label={`Scale bar ${bar} m`}>
        <rect x={0} y={0} width={bar / 2} height={font * 0.4} fill="#2e2116" />
        <rect
          x={bar / 2}
          y={0}
          width={bar / 2}
          height={font * 0.4}
          fill="#ffffff"
          stroke="#2e2116"
          strokeWidth={span / 600}
        />
        <text x={bar + font * 0.3} y={font * 0.45} fontSize={font} fill="#2e2116">
          {bar} m
        </text>
      </g>
    </svg>
  );
}
