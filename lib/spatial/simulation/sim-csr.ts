/** Prepared CSR models: L̂ (any edge correction), the pair correlation ĝ and the mean nearest-neighbour distance. */
import { kFunction, kToL } from "../estimators/k-function";
import { createIsotropicL } from "../kernel/l-isotropic";
import { nearestNeighbourDistances } from "../geometry/neighbours";
import { pairCorrelation } from "../estimators/pair-correlation";
import { createPairScanner } from "../kernel/pair-grid";
import { createTranslationL } from "../kernel/l-translation";
import type { Random } from "../random/random";
import { createWindowSampler } from "../random/sample-window";
import type { SimModel } from "./sim-models";
import { csrCount, simulateCsr } from "./simulate";
import type { Window } from "../types";

/** A model ready to run: m values per simulation, computed from a pattern. */
export interface PreparedModel {
  m: number;
  /** Draw one simulation from rng and write its m values at out[offset..]. */
  simulate(rng: Random, out: Float64Array, offset: number): void;
}

/** Statistic of a pattern for the CSR L model: L̂ with the chosen correction. */
export function csrLCurve(window: Window, r: Float64Array, correction: "isotropic" | "translation" | "border") {
  if (correction === "isotropic") {
    const est = createIsotropicL(window, r);
    return (x: Float64Array, y: Float64Array, n: number, out: Float64Array, offset: number): void => {
      est.l(x, y, n, out.subarray(offset, offset + r.length));
    };
  }
  // The translation weight depends only on the pair's displacement: with the window's set covariance
  // prepared once for the run, pairs are weighed by look-up in the enumerating pass (null for windows with
  // very many edges, which take the general estimator below).
  const fused = correction === "translation" ? createTranslationL(window, r) : null;
  const scanner = createPairScanner(window.bbox, r[r.length - 1]);
  return (x: Float64Array, y: Float64Array, n: number, out: Float64Array, offset: number): void => {
    if (fused && n >= 2) {
      fused.l(x, y, n, out.subarray(offset, offset + r.length));
      return;
    }
    const px = x.subarray(0, n),
      py = y.subarray(0, n);
    const pairs = scanner.within(px, py, n);
    const K = kFunction(window, { x: px, y: py }, { r, correction, pairs, label: "a simulated pattern" }).K[
      correction
    ]!;
    out.set(kToL(K), offset);
  };
}

/** ĝ of a pattern on the positive grid r, isotropic correction, with a fixed kernel half-width. */
export function pcfCurve(window: Window, r: Float64Array, halfWidth: number) {
  return (x: Float64Array, y: Float64Array, n: number, out: Float64Array, offset: number): void => {
    const g = pairCorrelation(
      window,
      { x: x.subarray(0, n), y: y.subarray(0, n) },
      { r, halfWidth, label: "a simulated pattern" },
    ).g.isotropic!;
    out.set(g, offset);
  };
}

export function prepareCsr(
  window: Window,
  r: Float64Array,
  model: Extract<SimModel, { kind: "csr-l" | "csr-nn" | "csr-g" }>,
): PreparedModel {
  const sampler = createWindowSampler(window);
  const buffers = { x: new Float64Array(model.n), y: new Float64Array(model.n) };
  if (model.kind === "csr-nn") {
    return {
      m: 1,
      simulate(rng, out, offset) {
        simulateCsr(sampler, model.n, rng, buffers);
        const nn = nearestNeighbourDistances({ x: buffers.x.subarray(0, model.n), y: buffers.y.subarray(0, model.n) });
        let sum = 0;
        for (let k = 0; k < nn.length; k++) sum += nn[k];
        out[offset] = sum / nn.length;
      },
    };
  }
  const curve = model.kind === "csr-g" ? pcfCurve(window, r, model.halfWidth) : csrLCurve(window, r, model.correction);
  return {
    m: r.length,
    simulate(rng, out, offset) {
      const n = csrCount(model.count, model.n, rng);
      simulateCsr(sampler, n, rng, buffers);
      curve(buffers.x, buffers.y, n, out, offset);
    },
  };
}
