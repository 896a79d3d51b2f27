/**
 * Pictures that go with a result but are not tests: the nearest-neighbour distance histogram, the quadrat
 * grid with counts (cells clipped to the trench, as the test uses them) and a kernel density for the heat
 * layer on the plan. Built from engine primitives; no database.
 */
import { nearestNeighbourDistances, clippedRingArea, type Window } from "@/lib/spatial";
import type { DensityOut, QuadratCell } from "./result-types";

export type Pts = { x: number[]; y: number[] };

/** Histogram of nearest-neighbour distances with Sturges' (1926) number of bins. */
export function nnHistogram(p: Pts): { edges: number[]; counts: number[]; distances: number[] } {
  if (p.x.length < 2) return { edges: [], counts: [], distances: [] };
  const d = Array.from(nearestNeighbourDistances({ x: Float64Array.from(p.x), y: Float64Array.from(p.y) }));
  const bins = Math.ceil(Math.log2(d.length) + 1);
  const top = Math.max(...d) || 1;
  const width = top / bins;
  const counts = new Array(bins).fill(0);
  for (const v of d) counts[Math.min(bins - 1, Math.floor(v / width))]++;
  return { edges: Array.from({ length: bins + 1 }, (_, k) => k * width), counts, distances: d };
}

/** Quadrat cells: the bounding box split into nx × ny equal cells, each clipped to W (holes subtracted). */
export function quadratCells(w: Window, nx: number, ny: number, p: Pts): QuadratCell[] {
  const { minX, minY, maxX, maxY } = w.bbox;
  const dx = (maxX - minX) / nx, dy = (maxY - minY) / ny;
  const counts = new Array(nx * ny).fill(0);
  for (let k = 0; k < p.x.length; k++) {
    const i = Math.min(nx - 1, Math.max(0, Math.floor((p.x[k] - minX) / dx)));
    const j = Math.min(ny - 1, Math.max(0, Math.floor((p.y[k] - minY) / dy)));
    counts[j * nx + i]++;
  }
  const cells: { x0: number; y0: number; x1: number; y1: number; count: number; area: number }[] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const x0 = minX + i * dx, y0 = minY + j * dy, x1 = x0 + dx, y1 = y0 + dy;
      // Rings are oriented (holes clockwise), so clipped areas are signed: subtract magnitudes.
      let area = Math.abs(clippedRingArea(w.outer as [number, number][], x0, y0, x1, y1));
      for (const h of w.holes) area -= Math.abs(clippedRingArea(h as [number, number][], x0, y0, x1, y1));
      if (area > 1e-9) cells.push({ x0, y0, x1, y1, count: counts[j * nx + i], area });
    }
  }
  const n = p.x.length;
  return cells.map(({ area, ...c }) => ({ ...c, expected: (n * area) / w.area }));
}

/**
 * Gaussian kernel intensity on a grid over the trench (Diggle 1985, with his edge correction: each value
 * divided by the kernel mass inside W, estimated on the same grid). Bandwidth by Scott's rule per axis
 * (Scott 1992, σ̂ · n^(−1/6)), averaged over the two axes. For the picture only; no test reads it.
 */
export function kernelDensity(w: Window, p: Pts, classId: string, cells = 60): DensityOut {
  const { minX, minY, maxX, maxY } = w.bbox;
  const span = Math.max(maxX - minX, maxY - minY);
  const dx = span / cells, nx = Math.max(1, Math.ceil((maxX - minX) / dx)), ny = Math.max(1, Math.ceil((maxY - minY) / dx));
  const n = p.x.length;
  const sd = (a: number[]) => {
    const m = a.reduce((s, v) => s + v, 0) / a.length;
    return Math.sqrt(a.reduce((s, v) => s + (v - m) ** 2, 0) / Math.max(1, a.length - 1));
  };
  const h = Math.max(dx, ((sd(p.x) + sd(p.y)) / 2) * n ** (-1 / 6));
  const inside = new Uint8Array(nx * ny);
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) inside[j * nx + i] = w.contains(minX + (i + 0.5) * dx, minY + (j + 0.5) * dx) ? 1 : 0;
  const reach = Math.ceil((3 * h) / dx);
  // The Gaussian kernel factorises, exp(−(a² + b²)/2h²) = exp(−a²/2h²)·exp(−b²/2h²), so each sum over a
  // square of cells is a sum over rows of sums over columns: a few exponentials per point instead of one
  // per cell, and the edge mass as two one-dimensional passes over the mask.
  const norm = 1 / (2 * Math.PI * h * h);
  const g = (d: number) => Math.exp(-(d * d) / (2 * h * h));
  const raw = new Float64Array(nx * ny);
  const gx = new Float64Array(2 * reach + 1), gy = new Float64Array(2 * reach + 1);
  for (let k = 0; k < n; k++) {
    const ci = Math.floor((p.x[k] - minX) / dx), cj = Math.floor((p.y[k] - minY) / dx);
    const i0 = Math.max(0, ci - reach), i1 = Math.min(nx - 1, ci + reach);
    const j0 = Math.max(0, cj - reach), j1 = Math.min(ny - 1, cj + reach);
    for (let i = i0; i <= i1; i++) gx[i - i0] = g(minX + (i + 0.5) * dx - p.x[k]);
    for (let j = j0; j <= j1; j++) gy[j - j0] = g(minY + (j + 0.5) * dx - p.y[k]) * norm;
    for (let j = j0; j <= j1; j++) {
      const wy = gy[j - j0], row = j * nx;
      for (let i = i0; i <= i1; i++) raw[row + i] += wy * gx[i - i0];
    }
  }
  // Edge correction: the kernel mass inside W around each grid cell.
  const lag = Float64Array.from({ length: reach + 1 }, (_, d) => g(d * dx));
  const across = new Float64Array(nx * ny); // per row: mask cells within reach along x, weighted
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      let sum = 0;
      for (let ii = Math.max(0, i - reach); ii <= Math.min(nx - 1, i + reach); ii++) if (inside[j * nx + ii]) sum += lag[Math.abs(ii - i)];
      across[j * nx + i] = sum;
    }
  }
  const values: number[] = new Array(nx * ny).fill(0);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      if (!inside[j * nx + i]) continue;
      let sum = 0;
      for (let jj = Math.max(0, j - reach); jj <= Math.min(ny - 1, j + reach); jj++) sum += lag[Math.abs(jj - j)] * across[jj * nx + i];
      const mass = sum * norm * dx * dx;
      values[j * nx + i] = Number((raw[j * nx + i] / Math.max(mass, 1e-6)).toPrecision(5));
    }
  }
  return { classId, nx, ny, minX, minY, dx, dy: dx, values, bandwidth: h, rule: "Gaussian kernel, Scott's rule (σ̂·n^(−1/6)), Diggle's edge correction" };
}
