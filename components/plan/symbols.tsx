/**
 * The eight find symbols, drawn on the plan canvas (traceSymbol) and in legends (symbolSvgPath). Filled
 * shapes get an outline and open shapes a halo (dark, or white round a dark colour: plan-colours.ts), so
 * every colour stays readable on a sunlit photo.
 */
import { haloFor } from "./plan-colours";

export type SymbolShape = "disc" | "square" | "triangle" | "diamond" | "cross" | "star" | "ring" | "bar";

export const openSymbols: ReadonlySet<string> = new Set(["ring", "cross"]);

function starPoints(x: number, y: number, r: number): [number, number][] {
  const pts: [number, number][] = [];
  for (let i = 0; i < 10; i++) {
    const a = -Math.PI / 2 + (i * Math.PI) / 5;
    const rr = i % 2 === 0 ? r * 1.15 : r * 0.5;
    pts.push([x + rr * Math.cos(a), y + rr * Math.sin(a)]);
  }
  return pts;
}

function poly(ctx: CanvasRenderingContext2D | Path2D, pts: [number, number][]) {
  pts.forEach(([x, y], i) => (i === 0 ? ctx.moveTo(x, y) : ctx.lineTo(x, y)));
  ctx.closePath();
}

/** Adds one symbol of radius r centred on (x, y) to the current path. */
export function traceSymbol(ctx: CanvasRenderingContext2D | Path2D, symbol: string, x: number, y: number, r: number) {
  switch (symbol) {
    case "square":
      ctx.rect(x - r * 0.85, y - r * 0.85, r * 1.7, r * 1.7);
      break;
    case "triangle":
      poly(ctx, [
        [x, y - r * 1.1],
        [x + r, y + r * 0.75],
        [x - r, y + r * 0.75],
      ]);
      break;
    case "diamond":
      poly(ctx, [
        [x, y - r * 1.15],
        [x + r, y],
        [x, y + r * 1.15],
        [x - r, y],
      ]);
      break;
    case "star":
      poly(ctx, starPoints(x, y, r));
      break;
    case "bar":
      ctx.rect(x - r * 1.1, y - r * 0.4, r * 2.2, r * 0.8);
      break;
    case "cross":
      ctx.moveTo(x - r, y - r);
      ctx.lineTo(x + r, y + r);
      ctx.moveTo(x + r, y - r);
      ctx.lineTo(x - r, y + r);
      break;
    case "ring":
      ctx.moveTo(x + r * 0.85, y);
      ctx.arc(x, y, r * 0.85, 0, Math.PI * 2);
      break;
    default:
      ctx.moveTo(x + r, y);
      ctx.arc(x, y, r, 0, Math.PI * 2);
  }
}

/** The same symbol as an SVG path in a box of side 2r centred on (r, r). */
export function symbolSvgPath(symbol: string, r = 8): string {
  const c = r;
  const f = (n: number) => n.toFixed(2);
  const P = (pts: [number, number][]) => "M" + pts.map(([x, y]) => `${f(x)},${f(y)}`).join("L") + "Z";
  switch (symbol) {
    case "square":
      return P([
        [c - r * 0.85, c - r * 0.85],
        [c + r * 0.85, c - r * 0.85],
        [c + r * 0.85, c + r * 0.85],
        [c - r * 0.85, c + r * 0.85],
      ]);
    case "triangle":
      return P([
        [c, c - r * 1.0],
        [c + r, c + r * 0.75],
        [c - r, c + r * 0.75],
      ]);
    case "diamond":
      return P([
        [c, c - r],
        [c + r * 0.9, c],
        [c, c + r],
        [c - r * 0.9, c],
      ]);
    case "star":
      return P(starPoints(c, c, r * 0.85));
    case "bar":
      return P([
        [c - r, c - r * 0.4],
        [c + r, c - r * 0.4],
        [c + r, c + r * 0.4],
        [c - r, c + r * 0.4],
      ]);
    case "cross":
      return `M${f(c - r * 0.8)},${f(c - r * 0.8)}L${f(c + r * 0.8)},${f(c + r * 0.8)}M${f(c + r * 0.8)},${f(c - r * 0.8)}L${f(c - r * 0.8)},${f(c + r * 0.8)}`;
    case "ring":
      return `M${f(c + r * 0.75)},${f(c)}A${f(r * 0.75)},${f(r * 0.75)} 0 1 0 ${f(c - r * 0.75)},${f(c)}A${f(r * 0.75)},${f(r * 0.75)} 0 1 0 ${f(c + r * 0.75)},${f(c)}Z`;
    default:
      return `M${f(c + r * 0.9)},${f(c)}A${f(r * 0.9)},${f(r * 0.9)} 0 1 0 ${f(c - r * 0.9)},${f(c)}A${f(r * 0.9)},${f(r * 0.9)} 0 1 0 ${f(c + r * 0.9)},${f(c)}Z`;
  }
}

export function SymbolIcon({ symbol, colour, size = 18 }: { symbol: string; colour: string; size?: number }) {
  const open = openSymbols.has(symbol);
  const r = size / 2;
  return (
    <svg
      width={size}
      height={size}
      viewBox={`${-1} ${-1} ${size + 2} ${size + 2}`}
      aria-hidden="true"
      className="shrink-0"
    >
      {open ? (
        <>
          <path d={symbolSvgPath(symbol, r)} fill="none" stroke={haloFor(colour)} strokeWidth={4} />
          <path d={symbolSvgPath(symbol, r)} fill="none" stroke={colour} strokeWidth={2.2} />
        </>
      ) : (
        <path d={symbolSvgPath(symbol, r)} fill={colour} stroke={haloFor(colour)} strokeWidth={1.3} />
      )}
    </svg>
  );
}
