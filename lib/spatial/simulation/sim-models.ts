/**
 * The simulation work the engine hands to worker threads, as plain JSON-able data (structured-clone safe):
 * a window, an r grid, one null model with the statistic it produces, and a range of simulation indices.
 * Simulation i of a chunk always draws from random stream (streamBase + i), so a chunk gives the same
 * numbers on any thread.
 */
import type { CsrCount } from "./simulate";
import type { WindowInput } from "../types";

/** An intensity surface on a pixel grid over the window's bounding box (row-major, row 0 at minY). */
export interface PixelIntensity {
  nx: number;
  ny: number;
  minX: number;
  minY: number;
  dx: number;
  dy: number;
  values: number[];
}

export type EdgeCorrection = "isotropic" | "translation" | "border";

export type SimModel =
  /** L̂ of CSR patterns with n or Poisson(n) points. */
  | { kind: "csr-l"; n: number; count: CsrCount; correction: EdgeCorrection }
  /** Pair correlation ĝ (kernel half-width fixed from the observed pattern) of CSR patterns; r > 0 only. */
  | { kind: "csr-g"; n: number; count: CsrCount; halfWidth: number }
  /** Mean nearest-neighbour distance of CSR patterns of n points (one value per simulation). */
  | { kind: "csr-nn"; n: number }
  /** Random labelling of fixed locations; labels 0 = class A, 1 = class B, 2 = neither. */
  | {
      kind: "labelling";
      x: number[];
      y: number[];
      labels: number[];
      statistic: "cross-l" | "cross-k" | "k-diff";
      correction: "isotropic" | "translation";
    }
  /**
   * Class A fixed at ax, ay; class B replaced by nB (or Poisson(nB)) CSR points. Cross-L̂_AB (cross-K̂_AB with fun
   * "K"), circles on A.
   */
  | {
      kind: "fixed-a";
      ax: number[];
      ay: number[];
      nB: number;
      count: CsrCount;
      correction: "isotropic" | "translation";
      fun?: "L" | "K";
    }
  /** Inhomogeneous Poisson by thinning, summarised by the inhomogeneous L (isotropic correction). */
  | { kind: "inhom-l"; lambda: PixelIntensity };

export interface SimSetup {
  window: WindowInput;
  r: number[];
  model: SimModel;
}

export interface SimChunk {
  setup: SimSetup;
  /** Identifies the setup so a worker can keep its prepared tables between chunks. */
  key: string;
  seed: number;
  streamBase: number;
  from: number;
  to: number;
}

export interface SimChunkResult {
  from: number;
  to: number;
  /** Values per simulation. */
  m: number;
  /** (to − from) × m values, row-major. */
  curves: Float64Array;
}
