/**
 * Loamwork's distribution-test engine: pure TypeScript, no framework imports. Coordinates in metres on
 * the site grid; every function throws SpatialInputError (errors.ts) with a message naming the problem,
 * and never returns NaN, except where an estimate does not exist: the border-corrected K and L beyond the r
 * where no point lies deep enough inside the window (spatstat's NA). Conventions follow spatstat 3.x (see the design
 * notes on statistics).
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
 *   nnHistogram(points) → nearest-neighbour distances in Sturges' bins, the picture beside Clark–Evans
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
 * Simulation, envelopes and global tests (random/, simulation/, envelopes/, kernel/l-isotropic.ts) and the
 * run (run/: spec, tests, verdicts, cautions) are re-exported below as well.
 *
 * Counts by grid square (lattice/; statistics.md, "Counts by grid square")
 *   buildLattice({ squares: LatticeSquare[] }, { neighbours: rook | queen (grid or shapes) | distance band,
 *     variable: "density" | "count", minArea, isolated: "refuse" | "drop" }) → units and neighbours
 *   latticeWeights(neighbours, "row" | "binary", self?) → weights with S0, S1, S2
 *   moranI, gearyC (normality, randomisation, permutations); localMoran, getisOrdStar (conditional
 *   permutations, Benjamini–Hochberg adjustment); runSquareTest(input, spec) → verdict, cautions, squares
 *   Checked against spdep in lattice/spdep.test.ts (fixtures and the R script in lattice/fixtures/).
 *
 * Folders, one concept each, tests beside the code: geometry/ (window, rings, edge corrections, neighbours),
 * random/ (seeded streams, sampling in a window), estimators/ (K, L, g, cross-K, K_inhom, intensity,
 * Clark–Evans, quadrats, the r grid), envelopes/ (bands and global tests), simulation/ (null models as data,
 * chunks of simulations), kernel/ (the cell grid and the isotropic scan with its WebAssembly build), run/
 * (the run spec, its tests, verdicts and cautions), lattice/ (square counts: neighbours, weights, Moran, Geary,
 * local tests, verdicts). Code outside lib/spatial imports this file only.
 */
export * from "./types";
export * from "./errors";
export { createWindow, rectangleWindow } from "./geometry/window";
export { checkPattern, type PatternCheck } from "./geometry/pattern";
export { pairsWithin, pairsBetween, nearestNeighbourDistances, type PairList } from "./geometry/neighbours";
export {
  defaultRGrid,
  defaultRMax,
  checkRGrid,
  createBinning,
  isAxisRectangle,
  type Binning,
  type RGridOptions,
} from "./estimators/r-grid";
export {
  isotropicPairWeights,
  isotropicCrossWeights,
  isotropicWeight,
  isotropicEdgeData,
  isotropicWeightAt,
} from "./geometry/edge-isotropic";
export { translationPairWeights, translationWeight, setCovariance } from "./geometry/edge-translation";
export { kFunction, lFunction, kToL, type KOptions, type KResult, type LResult } from "./estimators/k-function";
export {
  crossK,
  dotK,
  kDifference,
  type CrossKOptions,
  type CrossKResult,
  type KDifferenceResult,
} from "./estimators/cross-k";
export {
  pairCorrelation,
  type PairCorrelationOptions,
  type PairCorrelationResult,
} from "./estimators/pair-correlation";
export {
  clarkEvans,
  meanNearestNeighbour,
  CLARK_EVANS_SE_CONSTANT,
  type Alternative,
  type ClarkEvansResult,
} from "./estimators/clark-evans";
export {
  quadratTest,
  createQuadratLayout,
  quadratCounts,
  quadratChiSquare,
  type QuadratCell,
  type QuadratLayout,
  type QuadratResult,
} from "./estimators/quadrat";
export { nnHistogram, type NNHistogram } from "./estimators/nn-histogram";
export { gaussianEdgeMass } from "./geometry/kernel-mass";
export {
  intensityAtPoints,
  densityGrid,
  scottBandwidth,
  type DensityGrid,
  type IntensityOptions,
  type KernelEdge,
  type PointIntensity,
} from "./estimators/intensity";
export { kInhom, type KInhomOptions, type KInhomResult } from "./estimators/k-inhom";
export { diggleBandwidth, type DiggleBandwidth } from "./estimators/bandwidth";

export * from "./random/random";
export * from "./random/sample-window";
export * from "./simulation/simulate";
export * from "./envelopes/envelope";
export * from "./envelopes/global-test";
export * from "./envelopes/rank-envelope";
export * from "./kernel/l-isotropic";

export { runSimulations, type RunSimulationsOptions, type SimulationPool } from "./simulation/run-simulations";
export { runSimChunk } from "./simulation/sim-chunk";

// Simulation models as data, and the runs that the app, the command line and the workers start
export { fixedACurve, labellingCurve } from "./simulation/sim-classes";
export type { EdgeCorrection, PixelIntensity, SimChunk, SimModel, SimSetup } from "./simulation/sim-models";
export { monteCarloRankPValue, quadratGrid } from "./run/run-classic-tests";
export {
  parseRunSpec,
  runSpecSchema,
  testSpecSchema,
  type RunSpec,
  type RunSpecInput,
  type TestSpec,
  type TestSpecInput,
} from "./run/run-spec";
export {
  runDistributionTest,
  SMALL_RUN,
  type QuadratCellCount,
  type RunOptions,
  type RunResult,
  type TestPicture,
  type TestResult,
} from "./run/run-test";
export type { CurveFunction, EnvelopeOutcome, Excursion, GlobalSummary } from "./run/run-envelope";
export type { Verdict } from "./run/run-verdict";
export { ENGINE_VERSION } from "./version";

// Outline helpers shared with the plan editor, and the demo trench
export { clippedRingArea, firstSelfContact, insideRing, ringsTouch } from "./geometry/ring";
export { DEMO_TRENCH } from "./geometry/demo-window";

// Counts by grid square (lattice data): units, neighbours, weights and the square-count tests
export type * from "./lattice/types";
export { buildLattice, describeRule, type LatticeOptions } from "./lattice/lattice";
export { gridContiguity, shapeContiguity, distanceBand } from "./lattice/neighbours";
export { latticeWeights, spatialLag } from "./lattice/weights";
export { moranI, type GlobalTestOptions, type GlobalMoments, type MoranResult } from "./lattice/moran";
export { gearyC, type GearyResult } from "./lattice/geary";
export type { LatticeAlternative } from "./lattice/p-values";
export { localMoran, type LocalTestOptions, type LocalMoranResult, type Quadrant } from "./lattice/local-moran";
export { getisOrdStar, type GetisOrdResult } from "./lattice/getis-ord";
export { benjaminiHochberg } from "./lattice/fdr";
export {
  runSquareTest,
  runSquareTestAsync,
  squareTestSteps,
  type SquareResult,
  type SquareTestResult,
} from "./lattice/run-square-test";
export { PROGRESS_STEPS, type StepOptions, type AsyncStepOptions } from "./lattice/steps";
export {
  neighbourRuleSchema,
  parseSquareTestSpec,
  squareTestSpecSchema,
  type SquareTestSpec,
  type SquareTestSpecInput,
} from "./lattice/square-test-spec";
export { LATTICE_CAUTIONS, SQUARE_NULL, type SquareClass, type SquareVerdict } from "./lattice/square-verdict";
