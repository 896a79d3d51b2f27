import type { MapCell, MapLegend, SpotLine } from "@/lib/squares/map-cells";
import { SPOT_LINES } from "@/lib/squares/test-map";

const PAPER = "#efe6d3";
const INK = "#2e2116";
const n4 = (v: number) => Number(v.toFixed(4));
/** A dash pattern given in line widths ("4 2"), scaled to the drawing's units. */
const dashOf = (dash: string, width: number) =>
  dash
    .split(" ")
    .map((d) => n4(Number(d) * width))
    .join(" ");

function Swatch({
  kind,
  fill,
  x,
  y,
  s,
  hatch,
  line,
}: {
  kind: MapCell["kind"];
  fill?: string;
  x: number;
  y: number;
  s: number;
  hatch: string;
  line?: SpotLine;
}) {
  if (line)
    return (
      <rect
        x={x}
        y={y}
        width={s}
        height={s}
        fill="#ffffff"
        stroke={line.stroke}
        strokeWidth={s / 6}
        strokeDasharray={line.dash ? dashOf(line.dash, s / 6) : undefined}
      />
    );
  const common = { x, y, width: s, height: s, stroke: INK, strokeWidth: s / 30 };
  if (kind === "value") return <rect {...common} fill={fill} />;
  if (kind === "zero") return <rect {...common} fill="#ffffff" />;
  if (kind === "not-counted") return <rect {...common} fill="#c9c2b4" />;
  return <rect {...common} fill={`url(#${hatch})`} />;
}

/**
 * A cell's label size: no larger than the map's, and small enough that the words fit inside the cell (monospace, 0.6 em
 * a character).
 */
const fitFont = (text: string, cellWidth: number, most: number) =>
  Math.min(most, (cellWidth * 0.9) / (text.length * 0.6));

/**
 * A trench's squares on its plan, north up, in site-grid metres: shaded squares clipped to the outline and
 * holes, 0 white, not counted grey, not excavated hatched, and the legend drawn inside the figure so an
 * exported SVG or PNG keeps it. Each square's <g> carries what it shows (data-square, data-kind,
 * data-value, data-shade: its class on the scale from 0, data-spot: a local test's finding, also drawn as
 * an outline), so an exported file can be read back. No hooks: the trench record prints it from the
 * server; the squares panel passes `onCell` to make each square a button.
 */
export function SquareMap({
  id,
  outline,
  cells,
  legend,
  onCell,
  selected,
  ariaLabel,
}: {
  id: string;
  outline: [number, number][][];
  cells: MapCell[];
  legend: MapLegend;
  onCell?: (cell: MapCell) => void;
  selected?: string | null;
  ariaLabel: string;
}) {
  const all = outline.flat();
  const xs = all.map((p) => p[0]).concat(cells.flatMap((c) => [c.x0, c.x1]));
  const ys = all.map((p) => p[1]).concat(cells.flatMap((c) => [c.y0, c.y1]));
  const minX = Math.min(...xs),
    maxX = Math.max(...xs),
    minY = Math.min(...ys),
    maxY = Math.max(...ys);
  const w = maxX - minX,
    h = maxY - minY;
  const span = Math.max(w, h, 1e-9);
  const pad = span * 0.04;
  const font = span / 34;
  const sy = (y: number) => maxY - y;
  const path = outline
    .map((ring) => "M" + ring.map(([x, y]) => `${n4(x - minX)},${n4(sy(y))}`).join("L") + "Z")
    .join(" ");
  const legendTop = h + pad;
  const rowH = font * 1.6;
  const legendRows = 1 + (legend.note ? 1 : 0) + legend.items.length;
  const height = h + 2 * pad + rowH * legendRows + pad;
  const hatch = `${id}-hatch`;
  const clip = `${id}-clip`;
  const smallest = Math.min(...cells.map((c) => Math.min(c.x1 - c.x0, c.y1 - c.y0)), span);
  const cellFont = Math.min(font, smallest / 2.6);
  return (
    <svg
      viewBox={`${n4(-pad)} ${n4(-pad)} ${n4(w + 2 * pad)} ${n4(height)}`}
      className="h-auto w-full"
      // Squares that can be tapped are buttons; an image's children are hidden from assistive technology.
      role={onCell ? "group" : "img"}
      aria-label={ariaLabel}
      data-testid={`${id}-svg`}
    >
      <defs>
        <pattern
          id={hatch}
          patternUnits="userSpaceOnUse"
          width={span / 60}
          height={span / 60}
          patternTransform="rotate(45)"
        >
          <rect width={span / 60} height={span / 60} fill={PAPER} />
          <line x1={0} y1={0} x2={0} y2={span / 60} stroke="#a89c86" strokeWidth={span / 300} />
        </pattern>
        <clipPath id={clip}>
          <path d={path} clipRule="evenodd" />
        </clipPath>
      </defs>
      <path d={path} fill={PAPER} fillRule="evenodd" />
      <g clipPath={`url(#${clip})`}>
        {cells.map((c) => {
          const key = `${c.col},${c.row}`;
          const x = n4(c.x0 - minX),
            y = n4(sy(c.y1)),
            cw = n4(c.x1 - c.x0),
            ch = n4(c.y1 - c.y0);
          const fill =
            c.kind === "value"
              ? c.fill
              : c.kind === "zero"
                ? "#ffffff"
                : c.kind === "not-counted"
                  ? "#c9c2b4"
                  : `url(#${hatch})`;
          const tap = onCell
            ? {
                onClick: () => onCell(c),
                role: "button",
                tabIndex: 0,
                "aria-label": `Square ${c.label}: ${c.title}`,
                onKeyDown: (e: { key: string }) => (e.key === "Enter" || e.key === " ") && onCell(c),
                style: { cursor: "pointer" },
              }
            : {};
          const line: SpotLine | undefined = SPOT_LINES[c.spot as keyof typeof SPOT_LINES];
          return (
            <g
              key={key}
              data-square={c.label}
              data-kind={c.kind}
              data-value={c.value}
              data-shade={c.shade}
              data-spot={c.spot}
              {...tap}
            >
              <title>{`Square ${c.label}: ${c.title}`}</title>
              <rect
                x={x}
                y={y}
                width={cw}
                height={ch}
                fill={fill}
                stroke={selected === key ? "#d55e00" : "#ffffff"}
                strokeWidth={selected === key ? span / 120 : span / 500}
              />
              {line && (
                <rect
                  x={n4(x + span / 240)}
                  y={n4(y + span / 240)}
                  width={n4(Math.max(cw - span / 120, 0))}
                  height={n4(Math.max(ch - span / 120, 0))}
                  fill="none"
                  stroke={line.stroke}
                  strokeWidth={n4(span / 120)}
                  strokeDasharray={line.dash ? dashOf(line.dash, span / 120) : undefined}
                  pointerEvents="none"
                />
              )}
              {c.text && fitFont(c.text, cw, cellFont) > span / 200 && (
                <text
                  x={n4(x + cw / 2)}
                  y={n4(y + ch / 2)}
                  fontSize={n4(fitFont(c.text, cw, cellFont))}
                  textAnchor="middle"
                  dominantBaseline="middle"
                  fill={c.dark ? "#ffffff" : INK}
                  fontFamily="monospace"
                  pointerEvents="none"
                >
                  {c.text}
                </text>
              )}
            </g>
          );
        })}
      </g>
      <path d={path} fill="none" stroke={INK} strokeWidth={span / 250} fillRule="evenodd" pointerEvents="none" />
      <g fontSize={n4(font)} fill={INK} fontFamily="Georgia, serif">
        <text x={0} y={n4(legendTop + font)} fontWeight="bold">
          {legend.title}
        </text>
        {legend.note && (
          <text x={0} y={n4(legendTop + rowH + font)}>
            {legend.note}
          </text>
        )}
        {legend.items.map((it, i) => {
          const top = legendTop + rowH * (i + 1 + (legend.note ? 1 : 0));
          return (
            <g key={i}>
              <Swatch
                kind={it.kind}
                fill={it.fill}
                x={0}
                y={n4(top + font * 0.15)}
                s={n4(font)}
                hatch={hatch}
                line={it.line}
              />
              <text x={n4(font * 1.5)} y={n4(top + font)}>
                {it.label}
              </text>
            </g>
          );
        })}
      </g>
    </svg>
  );
}
