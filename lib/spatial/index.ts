/**
 * Loamwork's distribution-test engine: pure TypeScript, no framework imports. Coordinates in metres on
 * the site grid; every function throws SpatialInputError (errors.ts) with a message naming the problem,
 * and never returns NaN. Conventions follow spatstat 3.x (see the design notes on statistics).
 *
 * Window (the trench)
 *   createWindow({ outer, holes? }): Window          validated, orientation normalised, frozen
 *   rectangleWindow(x0, y0, x1, y1): Window
 *   Window: area, perimeter, bbox, diameter, edges (Float64Array), contains(x, y), boundaryDistance(x, y)
 * Points: { x, y } arrays (typed or plain); checkPattern(window, points) validates them.
 *
 * Neighbours
 *   pairsWithin(points, rmax) / pairsBetween(a, b, rmax): PairList { count, i, j, d }  (kdbush)
 *   nearestNeighbourDistances(points, to?): Float64Array
 *
 * Distances
 *   defaultRGrid(window, n, { count = 513, rmax? }), defaultRMax(window, n), checkRGrid(window, r)
 *
 * Tests and summary functions (options objects, defaults in brackets)
 *   clarkEvans(window, points, { alternative: "two-sided" }) → R, z, p, pClustered, pRegular, donnelly
 *   quadratTest(window, points, { nx: 5, ny: nx, alternative: "two-sided" }) → X2, df, p, cells, …
 *   kFunction(window, points, { r, correction: ["isotropic"] | "translation" | "border", pairs? }) → K
 *   lFunction(...) → L = √(K/π);  kToL(K)
 *   pairCorrelation(window, points, { r, correction, halfWidth: 0.15/√λ }) → g
 *   crossK(window, A, B, options) → K_AB, L_AB;  dotK(window, all, isA, options);  kDifference(window, A, B)
 *   kInhom(window, points, { lambda? | intensity: { sigma: "scott" }, renormalise: true }) → K, L
 *   intensityAtPoints(window, points, { sigma: "scott" | "diggle" | metres, edge: "uniform", leaveOneOut: true })
 *   scottBandwidth(points), diggleBandwidth(window, points) (Berman–Diggle cross-validation)
 *   densityGrid(window, points, { sigma: "scott", edge: "uniform", nx: 128 }) → the plan's heat layer
 * Edge weights, for callers that loop over many patterns
 *   isotropicPairWeights / isotropicCrossWeights / isotropicWeight (Ripley 1977, exact for polygons)
 *   translationPairWeights / translationWeight / setCovariance (Ohser 1983, exact polygon overlap)
 *   gaussianEdgeMass(window, x, y, σ) (kernel mass inside W)
 *
 * Simulation, envelopes and global tests (random.ts, sample-window.ts, simulate.ts, envelope.ts,
 * global-test.ts, rank-envelope.ts, l-isotropic.ts) are re-exported below as well.
 */
export * from "./types";
export * from "./errors";
export { createWindow, rectangleWindow } from "./window";
export { checkPattern, type PatternCheck } from "./pattern";
export { pairsWithin, pairsBetween, nearestNeighbourDistances, type PairList } from "./neighbours";
export { defaultRGrid, defaultRMax, checkRGrid, createBinning, isAxisRectangle, type Binning, type RGridOptions } from "./r-grid";
export { isotropicPairWeights, isotropicCrossWeights, isotropicWeight, isotropicEdgeData, isotropicWeightAt } from "./edge-isotropic";
export { translationPairWeights, translationWeight, setCovariance } from "./edge-translation";
export { kFunction, lFunction, kToL, type KOptions, type KResult, type LResult } from "./k-function";
export { crossK, dotK, kDifference, type CrossKOptions, type CrossKResult, type KDifferenceResult } from "./cross-k";
export { pairCorrelation, type PairCorrelationOptions, type PairCorrelationResult } from "./pair-correlation";
export { clarkEvans, meanNearestNeighbour, CLARK_EVANS_SE_CONSTANT, type Alternative, type ClarkEvansResult } from "./clark-evans";
export {
  quadratTest,
  createQuadratLayout,
  quadratCounts,
  quadratChiSquare,
  type QuadratCell,
  type QuadratLayout,
  type QuadratResult,
} from "./quadrat";
export { gaussianEdgeMass } from "./kernel-mass";
export {
  intensityAtPoints,
  densityGrid,
  scottBandwidth,
  type DensityGrid,
  type IntensityOptions,
  type KernelEdge,
  type PointIntensity,
} from "./intensity";
export { kInhom, type KInhomOptions, type KInhomResult } from "./k-inhom";
export { diggleBandwidth, type DiggleBandwidth } from "./bandwidth";

export * from "./random";
export * from "./sample-window";
export * from "./simulate";
export * from "./envelope";
export * from "./global-test";
export * from "./rank-envelope";
export * from "./l-isotropic";
