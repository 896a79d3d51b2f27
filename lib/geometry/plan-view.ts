/**
 * The plan's view: `scale` screen pixels per metre and the screen position of the grid origin. Grid y
 * runs north (up the screen), so screen y = oy − y·scale.
 */
export type View = { scale: number; ox: number; oy: number };
export type Bounds = { minX: number; minY: number; maxX: number; maxY: number };

/** The smallest box holding every point (x, y): an empty list gives an empty box (min Infinity, max −Infinity). */
export function boundsOf(points: Iterable<readonly [number, number]>): Bounds {
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (const [x, y] of points) {
    minX = Math.min(minX, x);
    minY = Math.min(minY, y);
    maxX = Math.max(maxX, x);
    maxY = Math.max(maxY, y);
  }
  return { minX, minY, maxX, maxY };
}

export const MIN_SCALE = 2;
export const MAX_SCALE = 20_000;

export const toScreen = (v: View, x: number, y: number): [number, number] => [v.ox + x * v.scale, v.oy - y * v.scale];
export const toWorld = (v: View, sx: number, sy: number): [number, number] => [
  (sx - v.ox) / v.scale,
  (v.oy - sy) / v.scale,
];

/** Zooms by `factor` keeping the grid point under screen (sx, sy) where it is. */
export function zoomAt(v: View, factor: number, sx: number, sy: number): View {
  const scale = Math.min(MAX_SCALE, Math.max(MIN_SCALE, v.scale * factor));
  const k = scale / v.scale;
  return { scale, ox: sx - (sx - v.ox) * k, oy: sy - (sy - v.oy) * k };
}

/** The view that shows `b` whole in a width × height viewport with `margin` pixels around it. */
export function fitBounds(b: Bounds, width: number, height: number, margin = 48): View {
  const w = Math.max(b.maxX - b.minX, 0.01);
  const h = Math.max(b.maxY - b.minY, 0.01);
  const scale = Math.min(MAX_SCALE, Math.max(MIN_SCALE, Math.min((width - 2 * margin) / w, (height - 2 * margin) / h)));
  const cx = (b.minX + b.maxX) / 2;
  const cy = (b.minY + b.maxY) / 2;
  return { scale, ox: width / 2 - cx * scale, oy: height / 2 + cy * scale };
}

/** The smallest 1, 2 or 5 × 10ⁿ metres that is at least `minMetres`. */
export function niceStep(minMetres: number): number {
  const p = Math.pow(10, Math.floor(Math.log10(minMetres)));
  for (const m of [1, 2, 5, 10]) if (m * p >= minMetres * (1 - 1e-12)) return m * p;
  return 10 * p;
}

/** Grid lines every `step` metres (at least `minPx` apart on screen) across the viewport. */
export function gridLines(v: View, width: number, height: number, minPx = 70) {
  const step = niceStep(minPx / v.scale);
  const [x0, y1] = toWorld(v, 0, 0);
  const [x1, y0] = toWorld(v, width, height);
  const xs: number[] = [];
  const ys: number[] = [];
  for (let x = Math.ceil(x0 / step) * step; x <= x1; x += step) xs.push(Number(x.toFixed(10)));
  for (let y = Math.ceil(y0 / step) * step; y <= y1; y += step) ys.push(Number(y.toFixed(10)));
  return { step, xs, ys };
}

/** A round length for the scale bar, about `targetPx` wide. */
export function scaleBar(v: View, targetPx = 120): { metres: number; px: number } {
  const metres = niceStep(targetPx / v.scale / 2.2);
  const options = [metres, metres * 2, metres * 5].filter((m) => m * v.scale <= targetPx * 1.05);
  const best = options[options.length - 1] ?? metres;
  return { metres: best, px: best * v.scale };
}

export function formatMetres(m: number): string {
  if (m >= 1) return `${Number(m.toFixed(3))} m`;
  if (m >= 0.01) return `${Number((m * 100).toFixed(1))} cm`;
  return `${Number((m * 1000).toFixed(1))} mm`;
}

/** Number of decimals a grid label needs at this step. */
export function labelDecimals(step: number): number {
  return Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
}
