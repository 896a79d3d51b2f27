/**
 * Prepared between-class models. Random labelling keeps the locations, so pairs, their bins and their
 * edge weights are computed once and each simulation only shuffles labels and re-adds; "one class fixed"
 * keeps class A's edge tables and redraws class B.
 *   cross-K_AB(r) = |W| / (n_A n_B) · Σ_{i∈A, j∈B} w_ij 1{d_ij < r}, circles centred on A (Lotwick &
 *   Silverman 1982, JRSS B 44:406–413; spatstat's Kcross convention);
 *   K difference K_AA − K_BB (Diggle & Chetwynd 1991, Biometrics 47:1155–1163).
 */
import { isotropicPairWeights } from "../geometry/edge-isotropic";
import { translationPairWeights, translationWeight } from "../geometry/edge-translation";
import { runSetCovarianceTable } from "../geometry/set-covariance-table";
import { SpatialInputError } from "../errors";
import { createIsotropicWeights, isotropicWeight } from "../kernel/isotropic-weights";
import { pairsWithin } from "../geometry/neighbours";
import { createPairScanner } from "../kernel/pair-grid";
import { createBinning } from "../estimators/r-grid";
import { createWindowSampler } from "../random/sample-window";
import type { PreparedModel } from "./sim-csr";
import type { SimModel } from "./sim-models";
import { csrCount, shuffleLabels, simulateCsr } from "./simulate";
import type { Window } from "../types";

function toL(sums: Float64Array, scale: number, out: Float64Array, offset: number): void {
  for (let k = 0; k < sums.length; k++) out[offset + k] = Math.sqrt(Math.max(0, sums[k] * scale) / Math.PI);
}

function toK(sums: Float64Array, scale: number, out: Float64Array, offset: number): void {
  for (let k = 0; k < sums.length; k++) out[offset + k] = sums[k] * scale;
}

/** The statistic of a labelling of fixed locations (labels 0 = A, 1 = B, 2 = neither). */
export function labellingCurve(window: Window, r: Float64Array, model: Extract<SimModel, { kind: "labelling" }>) {
  const x = Float64Array.from(model.x),
    y = Float64Array.from(model.y);
  const n = x.length,
    m = r.length;
  const pairs = pairsWithin({ x, y }, r[m - 1]);
  // each class's own K follows K's binning rule; cross-K always spatstat's generic one (r-grid.ts)
  const bin = createBinning(window, r, model.statistic === "k-diff" ? "auto" : "generic").bin;
  const bins = new Int32Array(pairs.count);
  for (let p = 0; p < pairs.count; p++) bins[p] = bin(pairs.d[p]);
  const iso = model.correction === "isotropic";
  // w_ij (centre i) and w_ji (centre j) per pair; translation weights are symmetric
  const w = iso
    ? isotropicPairWeights(window, x, y, n, pairs, r[m - 1])
    : translationPairWeights(window, x, y, x, y, pairs);
  const count = (labels: Int32Array, cls: number) => labels.reduce((s, l) => s + (l === cls ? 1 : 0), 0);
  const a = new Float64Array(m),
    b = new Float64Array(m);
  return (labels: Int32Array, out: Float64Array, offset: number): void => {
    const nA = count(labels, 0),
      nB = count(labels, 1);
    a.fill(0);
    b.fill(0);
    for (let p = 0; p < pairs.count; p++) {
      const k = bins[p];
      if (k >= m) continue;
      const li = labels[pairs.i[p]],
        lj = labels[pairs.j[p]];
      const wij = iso ? w[2 * p] : w[p],
        wji = iso ? w[2 * p + 1] : w[p];
      if (model.statistic !== "k-diff") {
        if (li === 0 && lj === 1) a[k] += wij;
        else if (li === 1 && lj === 0) a[k] += wji;
      } else if (li === lj) {
        if (li === 0) a[k] += wij + wji;
        else if (li === 1) b[k] += wij + wji;
      }
    }
    for (let k = 1; k < m; k++) {
      a[k] += a[k - 1];
      b[k] += b[k - 1];
    }
    if (model.statistic !== "k-diff") {
      (model.statistic === "cross-k" ? toK : toL)(a, window.area / (nA * nB), out, offset);
      return;
    }
    const sa = window.area / (nA * (nA - 1)),
      sb = window.area / (nB * (nB - 1));
    for (let k = 0; k < m; k++) out[offset + k] = a[k] * sa - b[k] * sb;
  };
}

/** Cross-L̂_AB (or cross-K̂_AB) with A fixed, as a function of the B pattern. */
export function fixedACurve(window: Window, r: Float64Array, model: Extract<SimModel, { kind: "fixed-a" }>) {
  const ax = Float64Array.from(model.ax),
    ay = Float64Array.from(model.ay);
  const nA = ax.length,
    m = r.length;
  const scanner = createPairScanner(window.bbox, r[m - 1]);
  const tables = createIsotropicWeights(window, r[m - 1]).prepare(ax, ay, nA);
  // the translation weight depends only on the displacement: the set covariance is prepared once per run and
  // kept in this thread for the next run in the same trench with the same r max
  const setCovariance = model.correction === "translation" ? runSetCovarianceTable(window, r[m - 1]) : null;
  const area = window.area;
  const bin = createBinning(window, r, "generic").bin;
  const sums = new Float64Array(m + 1);
  return (bx: Float64Array, by: Float64Array, nB: number, out: Float64Array, offset: number): void => {
    const pairs = scanner.between(ax, ay, nA, bx, by, nB);
    sums.fill(0);
    for (let p = 0; p < pairs.count; p++) {
      const i = pairs.i[p],
        j = pairs.j[p],
        d = pairs.d[p];
      const w =
        model.correction === "isotropic"
          ? isotropicWeight(tables, i, d)
          : setCovariance
            ? area / Math.max(setCovariance.at(bx[j] - ax[i], by[j] - ay[i]), 1e-12 * area)
            : translationWeight(window, bx[j] - ax[i], by[j] - ay[i]);
      sums[bin(d)] += w;
    }
    for (let k = 1; k < m; k++) sums[k] += sums[k - 1];
    (model.fun === "K" ? toK : toL)(sums.subarray(0, m), window.area / (nA * nB), out, offset);
  };
}

export function prepareClasses(
  window: Window,
  r: Float64Array,
  model: Extract<SimModel, { kind: "labelling" | "fixed-a" }>,
): PreparedModel {
  if (model.kind === "labelling") {
    const curve = labellingCurve(window, r, model);
    const labels = Int32Array.from(model.labels);
    return {
      m: r.length,
      simulate(rng, out, offset) {
        // Shuffling the observed labels afresh each time keeps simulation i independent of the others.
        const shuffled = labels.slice();
        shuffleLabels(shuffled, rng);
        curve(shuffled, out, offset);
      },
    };
  }
  if (model.ax.length < 1 || model.nB < 1) throw new SpatialInputError("Both classes need at least one point.");
  const curve = fixedACurve(window, r, model);
  const sampler = createWindowSampler(window);
  const buffers = { x: new Float64Array(model.nB), y: new Float64Array(model.nB) };
  return {
    m: r.length,
    simulate(rng, out, offset) {
      const nB = csrCount(model.count, model.nB, rng, 1);
      simulateCsr(sampler, nB, rng, buffers);
      curve(buffers.x, buffers.y, nB, out, offset);
    },
  };
}
