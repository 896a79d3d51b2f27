/**
 * Pictures that go with a result but are not tests: the nearest-neighbour distance histogram, the quadrat
 * grid with observed and expected counts in place, and a kernel density for the heat layer on the plan.
 * Every number comes from the engine (`lib/spatial`); this file only shapes it for storing and drawing.
 */
import { createQuadratLayout, densityGrid, nearestNeighbourDistances, type Window } from "@/lib/spatial";
import type { DensityOut, QuadratCell } from "@/lib/api/run-result";

export type Pts = { x: number[]; y: number[] };

/** Histogram of nearest-neighbour distances with Sturges' (1926) number of bins. */
export function nnHistogram(p: Pts): { edges: number[]; counts: number[]; distances: number[] } {
  if (p.x.length < 2) return { edges: [], counts: [], distances: [] };
  const d = Array.from(nearestNeighbourDistances({ x: Float64Array.from(p.x), y: Float64Array.from(p.y) }));
  const bins = Math.ceil(Math.log2(d.length) + 1);
  const top = Math.max(...d) || 1;
  const width = top / bins;
  const binOf = (v: number) => Math.min(bins - 1, Math.floor(v / width));
  const counts = Array.from({ length: bins }, (_, b) => d.filter((v) => binOf(v) === b).length);
  return { edges: Array.from({ length: bins + 1 }, (_, k) => k * width), counts, distances: d };
}

/**
 * The quadrat test's own cells (clipped to the trench, top row first) paired with the observed and
 * expected counts the engine reported for them, in the same order.
 */
export function quadratCellsOf(
  w: Window,
  nx: number,
  ny: number,
  observed: number[],
  expected: number[],
): QuadratCell[] {
  const { cells } = createQuadratLayout(w, nx, ny);
  if (cells.length !== observed.length || cells.length !== expected.length) {
    throw new Error(`The quadrat result has ${observed.length} counts for ${cells.length} cells.`);
  }
  return cells.map((c, k) => ({
    x0: c.x0,
    y0: c.y0,
    x1: c.x1,
    y1: c.y1,
    count: observed[k] ?? 0,
    expected: expected[k] ?? 0,
  }));
}

const DENSITY_PIXELS = 60;

/**
 * The heat layer: the engine's Gaussian kernel density (Scott's bandwidth, uniform edge correction — each
 * pixel divided by the kernel mass inside the trench, Diggle 1985) on a grid of about 60 pixels along the
 * trench's longer side. For the picture only; no test reads it.
 */
export function kernelDensity(w: Window, p: Pts, classId: string): DensityOut {
  const { minX, minY, maxX, maxY } = w.bbox;
  const long = Math.max(maxX - minX, maxY - minY);
  const nx = Math.max(1, Math.round((DENSITY_PIXELS * (maxX - minX)) / long));
  const ny = Math.max(1, Math.round((DENSITY_PIXELS * (maxY - minY)) / long));
  const g = densityGrid(w, { x: p.x, y: p.y }, { sigma: "scott", edge: "uniform", nx, ny });
  return {
    classId,
    nx: g.nx,
    ny: g.ny,
    minX: g.x0,
    minY: g.y0,
    dx: g.dx,
    dy: g.dy,
    values: Array.from(g.values, (v) => Number(v.toPrecision(5))),
    bandwidth: g.sigma,
    rule: "Gaussian kernel, Scott's rule (√(σ̂x·σ̂y)·n^(−1/6)), edge-corrected by the kernel mass inside the trench",
  };
}
