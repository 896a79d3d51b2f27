/**
 * Spatial weights from a neighbour list: binary or row-standardised, optionally with each unit as its own
 * neighbour (Getis–Ord Gi*; spdep's include.self), and the constants S0, S1, S2 of Cliff & Ord (1981,
 * Spatial Processes, ch. 1) that the analytical moments need, computed as spdep's spweights.constants.
 */
import type { LatticeWeights, NeighbourList, WeightStyle } from "./types";

export function latticeWeights(nb: NeighbourList, style: WeightStyle = "row", self = false): LatticeWeights {
  const { n } = nb;
  const extra = self ? 1 : 0;
  const start = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) start[i + 1] = start[i] + (nb.start[i + 1] - nb.start[i]) + extra;
  const index = new Int32Array(start[n]);
  const weight = new Float64Array(start[n]);
  const rowWeight = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const k = nb.start[i + 1] - nb.start[i] + extra;
    rowWeight[i] = style === "binary" ? 1 : k > 0 ? 1 / k : 0;
    let at = start[i];
    let selfPlaced = !self;
    for (let p = nb.start[i]; p < nb.start[i + 1]; p++) {
      const j = nb.index[p];
      if (!selfPlaced && j > i) {
        index[at++] = i;
        selfPlaced = true;
      }
      index[at++] = j;
    }
    if (!selfPlaced) index[at++] = i;
    weight.fill(rowWeight[i], start[i], start[i + 1]);
  }
  // The structure is symmetric, so w_ji is row j's weight whenever w_ij is non-zero.
  let S0 = 0;
  let S1 = 0;
  const colSum = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let p = start[i]; p < start[i + 1]; p++) {
      const j = index[p];
      const w = weight[p];
      S0 += w;
      S1 += (w + rowWeight[j]) ** 2;
      colSum[j] += w;
    }
  }
  S1 /= 2;
  let S2 = 0;
  for (let i = 0; i < n; i++) S2 += ((start[i + 1] - start[i]) * rowWeight[i] + colSum[i]) ** 2;
  return { n, start, index, weight, style, self, S0, S1, S2 };
}

/** The spatial lag Σ_j w_ij v_j of every unit. */
export function spatialLag(w: LatticeWeights, v: ArrayLike<number>): Float64Array {
  const out = new Float64Array(w.n);
  for (let i = 0; i < w.n; i++) {
    let s = 0;
    for (let p = w.start[i]; p < w.start[i + 1]; p++) s += w.weight[p] * v[w.index[p]];
    out[i] = s;
  }
  return out;
}
