/**
 * Curve tests built on the kernel estimators: the pair correlation ĝ under CSR (Stoyan & Stoyan 1994;
 * Epanechnikov kernel with Stoyan's half-width 0.15/√λ̂ of the observed pattern, kept fixed for the
 * simulations so that every curve is smoothed alike) and the inhomogeneous L.
 */
import { densityGrid } from "../estimators/intensity";
import { pairCorrelation } from "../estimators/pair-correlation";
import { classPoints, type RunContext } from "./run-context";
import { testGrid, windowInput } from "./run-curve-tests";
import { envelopeTest, type EnvelopeOutcome } from "./run-envelope";
import type { TestSpec } from "./run-spec";
import { inhomLCurve } from "../simulation/sim-inhom";
import type { PixelIntensity, SimSetup } from "../simulation/sim-models";

async function pcfTest(ctx: RunContext, t: Extract<TestSpec, { type: "pcf-envelope" }>): Promise<EnvelopeOutcome> {
  const p = classPoints(ctx, t.class);
  const n = p.x.length;
  const full = testGrid(ctx, n);
  const obs = pairCorrelation(ctx.window, p, { r: full, correction: "isotropic" });
  const r = obs.r;
  const setup: SimSetup = {
    window: windowInput(ctx.window),
    r: Array.from(r),
    model: { kind: "csr-g", n, count: t.count, halfWidth: obs.halfWidth },
  };
  return envelopeTest(ctx, setup, obs.g.isotropic!, new Float64Array(r.length).fill(1), t.statistic, "g");
}

/**
 * The intensity of the tested class: the kernel density of the reference finds (intensity.ts, Gaussian
 * kernel, edge-corrected, bandwidth σ given or by Scott's rule) rescaled so that it integrates to the
 * class's count over W. Pixels cut by the trench edge whose centre lies outside W get the mean of their
 * non-zero neighbours, so that a find near the edge never reads an intensity of 0.
 */
function classIntensity(
  ctx: RunContext,
  t: Extract<TestSpec, { type: "inhomogeneous-l" }>,
  nClass: number,
): { img: PixelIntensity; sigma: number } {
  const ref = classPoints(ctx, t.reference);
  const grid = densityGrid(ctx.window, ref, { sigma: t.bandwidth ?? "scott" });
  const { nx, ny } = grid;
  const v = Float64Array.from(grid.values);
  for (let iy = 0; iy < ny; iy++) {
    for (let ix = 0; ix < nx; ix++) {
      if (grid.values[iy * nx + ix] > 0) continue;
      let sum = 0,
        count = 0;
      for (let oy = Math.max(0, iy - 1); oy <= Math.min(ny - 1, iy + 1); oy++) {
        for (let ox = Math.max(0, ix - 1); ox <= Math.min(nx - 1, ix + 1); ox++) {
          const w = grid.values[oy * nx + ox];
          if (w > 0) {
            sum += w;
            count++;
          }
        }
      }
      v[iy * nx + ix] = count ? sum / count : 0;
    }
  }
  let mass = 0;
  for (let k = 0; k < grid.values.length; k++) mass += grid.values[k] * grid.dx * grid.dy;
  const scale = nClass / mass;
  const values = Array.from(v, (a) => a * scale);
  return { img: { nx, ny, minX: grid.x0, minY: grid.y0, dx: grid.dx, dy: grid.dy, values }, sigma: grid.sigma };
}

async function inhomTest(ctx: RunContext, t: Extract<TestSpec, { type: "inhomogeneous-l" }>): Promise<EnvelopeOutcome> {
  const p = classPoints(ctx, t.class);
  const n = p.x.length;
  const r = testGrid(ctx, n);
  const { img } = classIntensity(ctx, t, n);
  const observed = new Float64Array(r.length);
  inhomLCurve(ctx.window, r, img)(p.x, p.y, n, observed, 0);
  const setup: SimSetup = {
    window: windowInput(ctx.window),
    r: Array.from(r),
    model: { kind: "inhom-l", lambda: img },
  };
  return envelopeTest(ctx, setup, observed, Float64Array.from(r), t.statistic, "inhomogeneous L");
}

export async function extraCurveTest(
  ctx: RunContext,
  t: Extract<TestSpec, { type: "pcf-envelope" | "inhomogeneous-l" }>,
): Promise<EnvelopeOutcome> {
  return t.type === "pcf-envelope" ? pcfTest(ctx, t) : inhomTest(ctx, t);
}
