/**
 * Counts by grid square (lattice data): the shapes the app hands to the square-count tests. A square is an
 * areal unit of the trench's square grid, clipped to the outline and its holes. One input describes one
 * variable (a class's count or weight, over the spits or contexts in scope) on every square of the grid.
 */
import type { Ring } from "../types";

/** One square of the grid as recorded. */
export interface LatticeSquare {
  /** The square's id or label as the app shows it ("E12 N34"); named in errors and results. Unique. */
  id: string;
  /**
   * Column and row on the trench's grid (integers; column grows east, row grows north). For rook/queen from the grid.
   */
  col?: number;
  row?: number;
  /** Centre [x, y] in metres on the site grid (the centre of the whole grid square). For distance bands. */
  centre?: [number, number];
  /**
   * Excavated area in m²: the square clipped to the outline and holes, and to the part the spits in scope
   * cover. Zero means not excavated: the square is not a unit and is left out of every test.
   */
  area: number;
  /** The count (or weight in grams) of the class in the square, ≥ 0. A square with no record is not passed at all. */
  value: number;
  /**
   * The clipped square's boundary: every ring of it (the outer ring of each piece and any hole). Only the
   * boundary is read, for contiguity from the shapes ("shapes"); squares cut by the outline may lose or
   * keep their neighbours.
   */
  rings?: Ring[];
}

export interface LatticeInput {
  squares: LatticeSquare[];
}

/**
 * Which variable the tests read. "density" (the default) is value / excavated area, per m²: squares cut
 * by the outline or only partly dug are then comparable with whole squares. On a grid of equal areas the
 * two give the same statistics (every statistic here is unchanged by multiplying all values by a constant).
 */
export type LatticeVariable = "density" | "count";

/**
 * Who neighbours whom. Rook: squares sharing an edge; queen: an edge or a corner. From the grid's column
 * and row ("grid", the default), or from the clipped shapes ("shapes": rook needs a shared stretch of
 * boundary longer than the tolerance, queen any shared point). Distance band: square centres from
 * `lower` to `upper` metres apart, both ends included (as spdep's dnearneigh).
 */
export type NeighbourRule =
  { type: "rook" | "queen"; from?: "grid" | "shapes" } | { type: "distance"; upper: number; lower?: number };

/** Binary (w_ij = 1 for neighbours) or row-standardised (each row sums to 1: w_ij = 1 / number of neighbours). */
export type WeightStyle = "binary" | "row";

/**
 * Neighbours in compressed rows: unit i's neighbours are `index[start[i] .. start[i+1]-1]`, in increasing
 * order, never i itself. Symmetric for every rule here.
 */
export interface NeighbourList {
  n: number;
  start: Int32Array;
  index: Int32Array;
}

/** Spatial weights in compressed rows, with the constants of Cliff & Ord (1981). */
export interface LatticeWeights {
  n: number;
  start: Int32Array;
  index: Int32Array;
  weight: Float64Array;
  style: WeightStyle;
  /** True when each unit is its own neighbour (Getis–Ord Gi*). */
  self: boolean;
  /** S0 = Σ_ij w_ij. */
  S0: number;
  /** S1 = ½ Σ_ij (w_ij + w_ji)². */
  S1: number;
  /** S2 = Σ_i (w_i· + w_·i)². */
  S2: number;
}

/** A square left out of the tests, and why. */
export interface LeftOutSquare {
  id: string;
  reason: "not excavated" | "below the minimum area" | "no neighbours";
}

/** The units the tests run on: squares with excavated area, their values and neighbours. */
export interface Lattice {
  ids: string[];
  /** The variable tested (density per m² or count), one per unit. */
  values: Float64Array;
  areas: Float64Array;
  variable: LatticeVariable;
  neighbours: NeighbourList;
  rule: NeighbourRule;
  leftOut: LeftOutSquare[];
  /** The neighbour rule in words, for results ("queen contiguity on the grid"). */
  describe: string;
}
