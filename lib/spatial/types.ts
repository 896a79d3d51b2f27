/** Shared types of the Loamwork distribution-test engine. Coordinates are metres on the site grid. */

/** A closed ring of vertices [x, y]; the closing vertex may be repeated or omitted. */
export type Ring = [number, number][];

/** A trench outline as drawn: one outer ring and optional holes (baulks, pits left unexcavated). */
export interface WindowInput {
  outer: Ring;
  holes?: Ring[];
}

export interface BBox {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/**
 * A validated study area W. Rings are normalised: outer counter-clockwise, holes clockwise, so that
 * W's interior lies to the left of every edge. Frozen; safe to share between estimators.
 */
export interface Window {
  readonly outer: Ring;
  readonly holes: readonly Ring[];
  /** |W|, holes subtracted (m²). */
  readonly area: number;
  /** Length of every ring, holes included (m). */
  readonly perimeter: number;
  readonly bbox: BBox;
  /** Largest distance between two points of W (the largest vertex-to-vertex distance). */
  readonly diameter: number;
  /** Every edge of every ring as [x1, y1, x2, y2] with W's interior on the left. */
  readonly edges: Float64Array;
  readonly edgeCount: number;
  /** Ring boundaries inside `edges`: ring k owns edges ringStart[k] .. ringStart[k+1]-1. Ring 0 is the outer ring. */
  readonly ringStart: Int32Array;
  /** True for points inside W or on its boundary (within a tolerance of 1e-9 of the bbox size). */
  contains(x: number, y: number): boolean;
  /** Distance from (x, y) to the nearest edge of any ring. */
  boundaryDistance(x: number, y: number): number;
}

/** A point pattern as typed arrays; x[i], y[i] is find i. */
export interface Points {
  x: Float64Array;
  y: Float64Array;
}

/** Loose input accepted by the estimators: typed arrays or plain arrays of coordinates. */
export interface PointsInput {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
}

/** Edge corrections for K-type estimators (Ripley 1977; Ohser 1983). */
export type KCorrection = "isotropic" | "translation" | "border";

/** A function of distance on a grid r[0..m-1]. */
export interface RCurve {
  r: Float64Array;
  value: Float64Array;
}
