/** Canvas drawing for the plan layers, in screen pixels (the Konva layer has already applied the pixel ratio). */
import { gridLines, labelDecimals, toScreen, type View } from "@/lib/geometry/plan-view";
import { vertex, type Problem, type Pt, type Rings } from "@/lib/geometry/outline-edit";
import type { ClassRow, FindRow } from "./rows";
import { openSymbols, traceSymbol } from "./symbols";
import { pixelRatioOf, type Area } from "./view-cache";
import {
  ACCENT,
  EXTENT,
  GRID_LINE,
  GRID_LINE_PHOTO,
  GRID_LINE_PHOTO_DARK,
  haloFor,
  INK,
  LABEL_BACK,
  TRENCH_FILL,
  WARN,
} from "./plan-colours";

export { ACCENT, EXTENT, INK, WARN } from "./plan-colours";
export const FIND_R = 8;

export function drawGrid(c: CanvasRenderingContext2D, v: View, w: number, h: number, hasPhoto: boolean) {
  const g = gridLines(v, w, h);
  c.save();
  c.lineWidth = 1;
  c.strokeStyle = hasPhoto ? GRID_LINE_PHOTO : GRID_LINE;
  c.beginPath();
  for (const x of g.xs) {
    const sx = Math.round(toScreen(v, x, 0)[0]) + 0.5;
    c.moveTo(sx, 0);
    c.lineTo(sx, h);
  }
  for (const y of g.ys) {
    const sy = Math.round(toScreen(v, 0, y)[1]) + 0.5;
    c.moveTo(0, sy);
    c.lineTo(w, sy);
  }
  c.stroke();
  if (hasPhoto) {
    // A dark twin line keeps the grid visible over pale soil as well as dark.
    c.strokeStyle = GRID_LINE_PHOTO_DARK;
    c.setLineDash([4, 4]);
    c.stroke();
    c.setLineDash([]);
  }
  const d = labelDecimals(g.step);
  c.font = "600 12px var(--font-mono), ui-monospace, monospace";
  c.textBaseline = "top";
  const label = (text: string, x: number, y: number) => {
    const tw = c.measureText(text).width;
    c.fillStyle = LABEL_BACK;
    c.fillRect(x - 2, y - 1, tw + 4, 16);
    c.fillStyle = INK;
    c.fillText(text, x, y + 1);
  };
  for (const x of g.xs) label(`${x.toFixed(d)}`, toScreen(v, x, 0)[0] + 3, 4);
  for (const y of g.ys) label(`${y.toFixed(d)}`, 4, toScreen(v, 0, y)[1] + 3);
  c.restore();
  return g.step;
}

/**
 * Adds the points of a ring (or an open line) to the current path, in screen pixels; the caller closes it if it should
 * be closed.
 */
function traceRing(c: CanvasRenderingContext2D, v: View, ring: readonly Pt[]) {
  ring.forEach(([x, y], i) => (i === 0 ? c.moveTo(...toScreen(v, x, y)) : c.lineTo(...toScreen(v, x, y))));
}

export function drawOutline(
  c: CanvasRenderingContext2D,
  v: View,
  rings: Rings,
  hasPhoto: boolean,
  problem: Problem | null,
) {
  if (!rings.length) return;
  c.save();
  c.beginPath();
  for (const r of rings) {
    traceRing(c, v, r);
    c.closePath();
  }
  if (!hasPhoto) {
    c.fillStyle = TRENCH_FILL;
    c.fill("evenodd");
  }
  c.lineJoin = "round";
  c.strokeStyle = "#fff";
  c.lineWidth = 5;
  c.stroke();
  c.strokeStyle = INK;
  c.lineWidth = 2.5;
  c.stroke();
  // Holes: hatched so a baulk reads as "not dug" on paper and over a photo.
  for (const r of rings.slice(1)) {
    c.save();
    c.beginPath();
    traceRing(c, v, r);
    c.closePath();
    c.clip();
    c.strokeStyle = "rgba(46,33,22,0.55)";
    c.lineWidth = 1.5;
    c.beginPath();
    const xs = r.map((p) => toScreen(v, p[0], p[1]));
    const minX = Math.min(...xs.map((p) => p[0])),
      maxX = Math.max(...xs.map((p) => p[0]));
    const minY = Math.min(...xs.map((p) => p[1])),
      maxY = Math.max(...xs.map((p) => p[1]));
    for (let t = minX - (maxY - minY); t < maxX; t += 9) {
      c.moveTo(t, maxY);
      c.lineTo(t + (maxY - minY), minY);
    }
    c.stroke();
    c.restore();
  }
  if (problem) {
    c.strokeStyle = WARN;
    c.lineWidth = 6;
    c.setLineDash([10, 6]);
    c.beginPath();
    const ring = rings[problem.ring] ?? [];
    const edge = (r: readonly Pt[], i: number) => {
      c.moveTo(...toScreen(v, ...vertex(r, i)));
      c.lineTo(...toScreen(v, ...vertex(r, i + 1)));
    };
    if (problem.edges.length) {
      if (ring.length) problem.edges.forEach((i) => edge(ring, i));
    } else
      for (const k of problem.rings ?? [problem.ring]) {
        const r = rings[k] ?? [];
        r.forEach((_, i) => edge(r, i));
      }
    c.stroke();
    c.setLineDash([]);
  }
  c.restore();
}

/** Context extents: dashed outlines with the context number, under the finds. */
export function drawExtents(
  c: CanvasRenderingContext2D,
  v: View,
  contexts: { number: number; extent?: { coordinates: [number, number][][] } | null }[],
) {
  c.save();
  c.font = "700 12px var(--font-mono), ui-monospace, monospace";
  for (const ctx of contexts) {
    const rings = ctx.extent?.coordinates;
    if (!rings?.length) continue;
    c.beginPath();
    for (const r of rings) traceRing(c, v, r);
    c.setLineDash([7, 5]);
    c.strokeStyle = "#fff";
    c.lineWidth = 4;
    c.stroke();
    c.strokeStyle = EXTENT;
    c.lineWidth = 2;
    c.stroke();
    c.setLineDash([]);
    const corner = rings[0]?.[0];
    if (!corner) continue;
    const [lx, ly] = toScreen(v, ...corner);
    const label = String(ctx.number);
    const tw = c.measureText(label).width;
    c.fillStyle = EXTENT;
    c.fillRect(lx + 4, ly - 18, tw + 8, 16);
    c.fillStyle = "#fff";
    c.textBaseline = "top";
    c.fillText(label, lx + 8, ly - 16);
  }
  c.restore();
}

export function drawVertices(
  c: CanvasRenderingContext2D,
  v: View,
  rings: Rings,
  selected: { ring: number; v: number } | null,
) {
  c.save();
  rings.forEach((r, k) => {
    r.forEach((p, i) => {
      const q = vertex(r, i + 1);
      const [mx, my] = toScreen(v, (p[0] + q[0]) / 2, (p[1] + q[1]) / 2);
      c.beginPath();
      c.arc(mx, my, 6, 0, Math.PI * 2);
      c.fillStyle = "rgba(255,255,255,0.85)";
      c.fill();
      c.strokeStyle = ACCENT;
      c.lineWidth = 2;
      c.stroke();
      c.beginPath();
      c.moveTo(mx - 3.5, my);
      c.lineTo(mx + 3.5, my);
      c.moveTo(mx, my - 3.5);
      c.lineTo(mx, my + 3.5);
      c.stroke();
    });
    r.forEach((p, i) => {
      const [sx, sy] = toScreen(v, p[0], p[1]);
      const on = selected?.ring === k && selected.v === i;
      c.beginPath();
      c.arc(sx, sy, on ? 11 : 9, 0, Math.PI * 2);
      c.fillStyle = on ? ACCENT : "#fff";
      c.fill();
      c.lineWidth = 2.5;
      c.strokeStyle = INK;
      c.stroke();
    });
  });
  c.restore();
}

export function drawDrawing(c: CanvasRenderingContext2D, v: View, pts: Pt[], pointer: Pt | null) {
  if (!pts.length) return;
  c.save();
  c.strokeStyle = ACCENT;
  c.lineWidth = 3;
  c.setLineDash([8, 5]);
  c.beginPath();
  traceRing(c, v, pts);
  if (pointer) c.lineTo(...toScreen(v, ...pointer));
  c.stroke();
  c.setLineDash([]);
  pts.forEach((p, i) => {
    const [sx, sy] = toScreen(v, ...p);
    c.beginPath();
    c.arc(sx, sy, i === 0 ? 12 : 7, 0, Math.PI * 2);
    c.fillStyle = i === 0 ? "rgba(29,92,140,0.35)" : "#fff";
    c.fill();
    c.strokeStyle = ACCENT;
    c.lineWidth = 2.5;
    c.stroke();
  });
  c.restore();
}

const sprites = new Map<string, HTMLCanvasElement>();
const SPRITE_CSS = FIND_R * 2 + 10;

/**
 * One pre-drawn image per class symbol and colour: blitting 5,000 small images is far cheaper than
 * rasterising 5,000 vector outlines each frame, which matters on tablets without a fast GPU.
 */
function sprite(symbol: string, colour: string, ratio: number): HTMLCanvasElement {
  const key = `${symbol}|${colour}|${ratio}`;
  let canvas = sprites.get(key);
  if (canvas) return canvas;
  canvas = document.createElement("canvas");
  canvas.width = canvas.height = Math.ceil(SPRITE_CSS * ratio);
  const c = canvas.getContext("2d")!;
  c.scale(ratio, ratio);
  c.lineJoin = "round";
  c.beginPath();
  traceSymbol(c, symbol, SPRITE_CSS / 2, SPRITE_CSS / 2, FIND_R);
  if (openSymbols.has(symbol)) {
    c.strokeStyle = haloFor(colour);
    c.lineWidth = 5;
    c.stroke();
    c.strokeStyle = colour;
    c.lineWidth = 2.6;
    c.stroke();
  } else {
    c.fillStyle = colour;
    c.fill();
    c.strokeStyle = haloFor(colour);
    c.lineWidth = 1.4;
    c.stroke();
  }
  sprites.set(key, canvas);
  return canvas;
}

/**
 * Finds in one pass, one cached sprite per class, skipping those outside `area` (the viewport, or the
 * larger bitmap of a view cache) and the one with id `skip` (being dragged, drawn on its own).
 */
export function drawFinds(
  c: CanvasRenderingContext2D,
  v: View,
  finds: readonly FindRow[],
  classes: Map<string, ClassRow>,
  area: Area,
  skip?: string | null,
) {
  const ratio = pixelRatioOf(c);
  const byClass = new Map<string, HTMLCanvasElement>();
  const half = SPRITE_CSS / 2;
  const [x0, y0, x1, y1] = [area.x0 - half, area.y0 - half, area.x1 + half, area.y1 + half];
  c.save();
  c.imageSmoothingEnabled = false;
  for (const f of finds) {
    if (f.id === skip) continue;
    const sx = v.ox + f.x * v.scale;
    const sy = v.oy - f.y * v.scale;
    if (sx < x0 || sy < y0 || sx > x1 || sy > y1) continue;
    let img = byClass.get(f.classId);
    if (!img) {
      const cls = classes.get(f.classId);
      byClass.set(f.classId, (img = sprite(cls?.symbol ?? "disc", cls?.colour ?? "#666666", ratio)));
    }
    c.drawImage(img, Math.round(sx - half), Math.round(sy - half), SPRITE_CSS, SPRITE_CSS);
  }
  c.restore();
}
