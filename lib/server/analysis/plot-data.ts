/**
 * The heat layer on the plan, a picture that goes with a result but is no test: the engine's kernel density
 * (`lib/spatial`) on a grid sized for the screen. The tests' own pictures come with the engine's result.
 */
import { densityGrid, type Window } from "@/lib/spatial";
import type { DensityOut } from "@/lib/api/run-result";

export type Pts = { x: number[]; y: number[] };

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
