/**
 * Cross-type K and L between two classes of finds (Lotwick & Silverman 1982, JRSS B 44:406–413), the dot
 * function K_{i•}, and the K difference K_AA − K_BB for segregation (Diggle & Chetwynd 1991, Biometrics
 * 47:1155–1163). spatstat 3.x conventions (`Kmulti`): K_AB(r) = |W| / (n_A n_B) · Σ_{a∈A} Σ_{b∈B} w_ab
 * 1{d_ab < r}, the isotropic circle centred on the A point; border: numerator / (λ_B · #{a: b_a ≥ r⁻});
 * always the generic binning rule (r-grid.ts).
 */
import { borderCounts, cumulativePairSum } from "./k-accumulate";
import { isotropicCrossWeights } from "../geometry/edge-isotropic";
import { translationPairWeights } from "../geometry/edge-translation";
import { boundaryDistances, borderRatio, corrections, kFunction, kToL, type KOptions } from "./k-function";
import { pairsBetween, pairsWithin, type PairList } from "../geometry/neighbours";
import { checkPattern } from "../geometry/pattern";
import { checkRGrid, createBinning, defaultRGrid } from "./r-grid";
import { SpatialInputError } from "../errors";
import type { KCorrection, Points, PointsInput, Window } from "../types";

export interface CrossKOptions extends Omit<KOptions, "label" | "pairs"> {
  /** Names of the two classes in messages (default "class A", "class B"). */
  labels?: [string, string];
}

export interface CrossKResult {
  r: Float64Array;
  theo: Float64Array;
  nA: number;
  nB: number;
  area: number;
  K: Partial<Record<KCorrection, Float64Array>>;
  L: Partial<Record<KCorrection, Float64Array>>;
}

function theoretical(r: Float64Array): Float64Array {
  return r.map((v) => Math.PI * v * v);
}

/**
 * Shared core: centres `a` (n_A of them), partners counted through `pairs` (i indexes a, j indexes b),
 * divisor n_A·n_B/|W|.
 */
function crossCore(
  window: Window,
  a: Points,
  b: Points,
  nB: number,
  pairs: PairList,
  r: Float64Array,
  wanted: KCorrection[],
): CrossKResult {
  const m = r.length;
  const nA = a.x.length;
  const binning = createBinning(window, r, "generic");
  const scale = window.area / (nA * nB);
  const K: CrossKResult["K"] = {};
  const L: CrossKResult["L"] = {};
  for (const c of wanted) {
    if (c === "border") {
      const num = new Float64Array(m);
      const den = new Float64Array(m);
      borderCounts(binning, m, pairs, boundaryDistances(window, a.x, a.y), null, false, num, den);
      K.border = borderRatio(num, den, nB / window.area);
    } else {
      const w =
        c === "isotropic"
          ? isotropicCrossWeights(window, a.x, a.y, nA, pairs, r[m - 1])
          : translationPairWeights(window, a.x, a.y, b.x, b.y, pairs);
      const sum = cumulativePairSum(binning.bin, m, pairs, w, false, new Float64Array(m));
      for (let k = 0; k < m; k++) sum[k] *= scale;
      K[c] = sum;
    }
    L[c] = kToL(K[c]!);
  }
  return { r, theo: theoretical(r), nA, nB, area: window.area, K, L };
}

/** K_AB and L_AB between class A (centres) and class B. Default r grid from λ_B, as spatstat's Kcross. */
export function crossK(
  window: Window,
  classA: PointsInput,
  classB: PointsInput,
  options: CrossKOptions = {},
): CrossKResult {
  const [labelA, labelB] = options.labels ?? ["class A", "class B"];
  const a = checkPattern(window, classA, { label: labelA, minPoints: 1 });
  const b = checkPattern(window, classB, { label: labelB, minPoints: 1 });
  if (a.x.length + b.x.length < 2) throw new SpatialInputError("Cross-K needs at least 2 finds in all.");
  const r = options.r ? checkRGrid(window, options.r) : defaultRGrid(window, b.x.length);
  const pairs = pairsBetween(a, b, r[r.length - 1]);
  return crossCore(window, a, b, b.x.length, pairs, r, corrections(options.correction));
}

/**
 * K_{A•}: class A against every find (A included, a find never paired with itself); divisor n_A·n/|W|
 * (spatstat's Kdot). `isA[k]` marks the finds of class A.
 */
export function dotK(
  window: Window,
  points: PointsInput,
  isA: ArrayLike<boolean>,
  options: CrossKOptions = {},
): CrossKResult {
  const [labelA] = options.labels ?? ["class A"];
  const all = checkPattern(window, points, { label: "the finds" });
  const n = all.x.length;
  if (isA.length !== n) throw new SpatialInputError(`${n} finds but ${isA.length} class labels.`);
  const index = new Int32Array(n).fill(-1);
  let nA = 0;
  for (let k = 0; k < n; k++) if (isA[k]) index[k] = nA++;
  if (nA === 0) throw new SpatialInputError(`${labelA} has no points (an empty class cannot be tested).`);
  const a: Points = { x: new Float64Array(nA), y: new Float64Array(nA) };
  for (let k = 0; k < n; k++) {
    if (index[k] >= 0) {
      a.x[index[k]] = all.x[k];
      a.y[index[k]] = all.y[k];
    }
  }
  const r = options.r ? checkRGrid(window, options.r) : defaultRGrid(window, n);
  // Each unordered pair of finds gives an ordered pair for every end that is of class A.
  const within = pairsWithin(all, r[r.length - 1]);
  const pairs: PairList = {
    count: 0,
    i: new Int32Array(2 * within.count),
    j: new Int32Array(2 * within.count),
    d: new Float64Array(2 * within.count),
  };
  for (let p = 0; p < within.count; p++) {
    const u = within.i[p];
    const v = within.j[p];
    for (const [c, o] of [
      [u, v],
      [v, u],
    ]) {
      if (index[c] < 0) continue;
      pairs.i[pairs.count] = index[c];
      pairs.j[pairs.count] = o;
      pairs.d[pairs.count++] = within.d[p];
    }
  }
  return crossCore(window, a, all, n, pairs, r, corrections(options.correction));
}

export interface KDifferenceResult {
  r: Float64Array;
  /** K_AA − K_BB per correction; 0 for all r under random labelling in expectation. */
  difference: Partial<Record<KCorrection, Float64Array>>;
  KAA: Partial<Record<KCorrection, Float64Array>>;
  KBB: Partial<Record<KCorrection, Float64Array>>;
}

/** D(r) = K_AA(r) − K_BB(r), each class's own K in the whole window (Diggle & Chetwynd 1991). */
export function kDifference(
  window: Window,
  classA: PointsInput,
  classB: PointsInput,
  options: CrossKOptions = {},
): KDifferenceResult {
  const [labelA, labelB] = options.labels ?? ["class A", "class B"];
  const nAll = classA.x.length + classB.x.length;
  const wanted = corrections(options.correction);
  if (wanted.includes("border") && !options.r) {
    throw new SpatialInputError(
      "The K difference with the border correction needs an explicit r grid (both classes must share it).",
    );
  }
  const r = options.r ? checkRGrid(window, options.r) : defaultRGrid(window, Math.max(nAll, 1));
  const ka = kFunction(window, classA, { r, correction: wanted, label: labelA });
  const kb = kFunction(window, classB, { r, correction: wanted, label: labelB });
  const difference: KDifferenceResult["difference"] = {};
  for (const c of wanted) difference[c] = ka.K[c]!.map((v, k) => v - kb.K[c]![k]);
  return { r, difference, KAA: ka.K, KBB: kb.K };
}
