/**
 * Fits a vertical site photo to the site grid from control points: each point is a pixel on the photo
 * (x right, y down, as images are stored) and its site-grid position in metres (x east, y north).
 *
 * - 2 points: similarity (scale, rotation, shift). Because photo y runs down and grid y runs up, the
 *   similarity includes that one mirror of the photo's y axis; any other mirror is not a similarity.
 * - 3 points: affine (six parameters), linear least squares.
 * - 4 or more: projective (homography). The normalised direct linear transform (Hartley & Zisserman,
 *   Multiple View Geometry in Computer Vision, 2nd ed. (2003), Algorithm 4.2) gives the start; it
 *   minimises an algebraic error. Levenberg–Marquardt iterations (ibid. §A6.2) then minimise the sum of
 *   squared residuals in metres on the grid, the error in one image of §4.2.2 (eq. 4.6): the photo
 *   pixels are taken as exact, the surveyed grid positions as what is in error. The residuals reported
 *   are those same distances, so the refined fit never reports a larger RMS than the DLT alone.
 *
 * More points than a model needs make it over-determined; the residuals (metres on the grid) then say
 * how well the photo agrees with the pegs. A model may be chosen below the one the count suggests.
 */
import { Matrix } from "ml-matrix";
import { invert3, leastSquares, ofLength, solveSquare, symmetricEigen, type Tuple } from "./small-linalg";

export type ControlPoint = { px: number; py: number; x: number; y: number };
export type FitModel = "similarity" | "affine" | "projective";

export type PhotoFit = {
  model: FitModel;
  /** Row-major 3×3 matrix taking homogeneous photo pixels (px, py, 1) to grid metres. */
  matrix: number[];
  /** Distance in metres between each point's grid position and where the fit puts its pixel. */
  residuals: number[];
  /** Root mean square of the residuals, metres. */
  rms: number;
  /** Points beyond the minimum the model needs; 0 means the fit passes through every point exactly. */
  redundancy: number;
};

export class PhotoFitError extends Error {
  constructor(
    message: string,
    readonly points: number[] = [],
  ) {
    super(message);
    this.name = "PhotoFitError";
  }
}

export const minimumPoints: Record<FitModel, number> = { similarity: 2, affine: 3, projective: 4 };

export function modelForCount(n: number): FitModel {
  return n >= 4 ? "projective" : n === 3 ? "affine" : "similarity";
}

type Mat3 = Tuple<9>;

/** A stored fit matrix as nine numbers, or a clear refusal (a stored fit that lost entries is not drawn). */
export function mat3(matrix: readonly number[]): Mat3 {
  const m = ofLength(matrix, 9);
  if (!m) throw new PhotoFitError(`A photo fit matrix has nine entries; this one has ${matrix.length}.`);
  return m;
}

/** Where the fit puts photo pixel (px, py) on the grid. */
export function applyFit(matrix: readonly number[], px: number, py: number): [number, number] {
  const [a, b, c, d, e, f, g, h, i] = mat3(matrix);
  const w = g * px + h * py + i;
  return [(a * px + b * py + c) / w, (d * px + e * py + f) / w];
}

/** The grid → photo matrix. */
export function invertFit(matrix: readonly number[]): number[] {
  const inv = invert3(mat3(matrix));
  if (!inv) throw new PhotoFitError("The fit cannot be inverted (it squashes the photo to a line).");
  return inv;
}

type Norm = { cx: number; cy: number; s: number };
type XY = [number, number];

/** Centroid to the origin, mean distance √2 (Hartley & Zisserman 2003, §4.4.4). */
function normaliser(points: readonly XY[]): Norm {
  const n = points.length;
  const cx = points.reduce((a, p) => a + p[0], 0) / n;
  const cy = points.reduce((a, p) => a + p[1], 0) / n;
  const mean = points.reduce((a, p) => a + Math.hypot(p[0] - cx, p[1] - cy), 0) / n;
  return { cx, cy, s: Math.SQRT2 / mean };
}

const normMatrix = (t: Norm): Mat3 => [t.s, 0, -t.s * t.cx, 0, t.s, -t.s * t.cy, 0, 0, 1];
const normInverse = (t: Norm): Mat3 => [1 / t.s, 0, t.cx, 0, 1 / t.s, t.cy, 0, 0, 1];

function mul3(a: Mat3, b: Mat3): Mat3 {
  const rows = (m: Mat3) => [m.slice(0, 3), m.slice(3, 6), m.slice(6, 9)];
  return mat3(new Matrix(rows(a)).mmul(new Matrix(rows(b))).to1DArray());
}

/** Every pair (i < j) of a list, with the items. */
function* pairs<T>(items: readonly T[]): Generator<[number, T, number, T]> {
  for (const [i, a] of items.entries()) for (const [j, b] of items.entries()) if (j > i) yield [i, a, j, b];
}

/** Every triple (i < j < k) of a list, with the items. */
function* triples<T>(items: readonly T[]): Generator<[[number, number, number], T, T, T]> {
  for (const [i, a, j, b] of pairs(items)) for (const [k, c] of items.entries()) if (k > j) yield [[i, j, k], a, b, c];
}

/** Twice the triangle's area over its longest side squared: 0 for three points on a line. */
function flatness(a: XY, b: XY, c: XY): number {
  const cross = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
  const longest = Math.max(
    (b[0] - a[0]) ** 2 + (b[1] - a[1]) ** 2,
    (c[0] - a[0]) ** 2 + (c[1] - a[1]) ** 2,
    (c[0] - b[0]) ** 2 + (c[1] - b[1]) ** 2,
  );
  return Math.abs(cross) / longest;
}

/** Below this flatness three points count as collinear (a 0.1 % bulge on the longest side). */
const FLAT = 1e-3;

function allCollinear(pts: readonly XY[]): boolean {
  for (const [, a, b, c] of triples(pts)) if (flatness(a, b, c) >= FLAT) return false;
  return true;
}

function firstCollinearTriple(pts: readonly XY[]): [number, number, number] | null {
  for (const [at, a, b, c] of triples(pts)) if (flatness(a, b, c) < FLAT) return at;
  return null;
}

/** Refuses point sets that cannot fix the chosen model, naming the points (1-based). */
export function assertUsable(points: readonly ControlPoint[], model: FitModel): void {
  const need = minimumPoints[model];
  if (points.length < need)
    throw new PhotoFitError(`A ${model} fit needs at least ${need} control points; there are ${points.length}.`);
  for (const p of points) {
    if (![p.px, p.py, p.x, p.y].every(Number.isFinite))
      throw new PhotoFitError("Every control point needs a photo position and finite grid coordinates.");
  }
  for (const [i, p, j, q] of pairs(points)) {
    if (Math.hypot(p.px - q.px, p.py - q.py) < 0.5) {
      throw new PhotoFitError(`Points ${i + 1} and ${j + 1} are on the same spot of the photo (duplicate points).`, [
        i,
        j,
      ]);
    }
    if (Math.hypot(p.x - q.x, p.y - q.y) < 0.001) {
      throw new PhotoFitError(`Points ${i + 1} and ${j + 1} have the same grid position (duplicate points).`, [i, j]);
    }
  }
  if (model === "similarity") return;
  const photo = points.map((p): XY => [p.px, p.py]);
  const grid = points.map((p): XY => [p.x, p.y]);
  for (const [set, where] of [
    [photo, "on the photo"],
    [grid, "on the grid"],
  ] as const) {
    if (allCollinear(set))
      throw new PhotoFitError(
        `All control points lie on one line ${where} (collinear); add a point off that line.`,
        points.map((_, i) => i),
      );
    if (model === "projective" && points.length === 4) {
      const t = firstCollinearTriple(set);
      if (t) {
        throw new PhotoFitError(
          `Points ${t.map((i) => i + 1).join(", ")} lie on one line ${where} (collinear); four points for a projective fit need no three in line.`,
          t,
        );
      }
    }
  }
}

/** A control point normalised: photo (u, v), grid (X, Y). */
type Pair = { u: number; v: number; X: number; Y: number };

function fitSimilarity(pts: readonly Pair[]): Mat3 | null {
  // x = a·px + b·py + tx, y = b·px − a·py + ty: rotation and scale with the photo's y axis mirrored.
  const rows = pts.flatMap((p) => [
    [p.u, p.v, 1, 0],
    [-p.v, p.u, 0, 1],
  ]);
  const rhs = pts.flatMap((p) => [p.X, p.Y]);
  const s = ofLength(leastSquares(rows, rhs), 4);
  return s && [s[0], s[1], s[2], s[1], -s[0], s[3], 0, 0, 1];
}

function fitAffine(pts: readonly Pair[]): Mat3 | null {
  const rows = pts.map((p) => [p.u, p.v, 1]);
  const a = ofLength(
    leastSquares(
      rows,
      pts.map((p) => p.X),
    ),
    3,
  );
  const b = ofLength(
    leastSquares(
      rows,
      pts.map((p) => p.Y),
    ),
    3,
  );
  return a && b && [...a, ...b, 0, 0, 1];
}

function fitProjective(pts: readonly Pair[]): Mat3 | null {
  const a = new Matrix(
    pts.flatMap((p) => [
      [-p.u, -p.v, -1, 0, 0, 0, p.u * p.X, p.v * p.X, p.X],
      [0, 0, 0, -p.u, -p.v, -1, p.u * p.Y, p.v * p.Y, p.Y],
    ]),
  );
  const { values, vectors } = symmetricEigen(a.transpose().mmul(a).to2DArray());
  const ev = ofLength(values, 9);
  if (!ev) return null;
  // A second near-zero eigenvalue means a family of solutions: the points do not fix the homography.
  if (ev[1] <= 1e-10 * Math.max(ev[8], 1e-300)) return null;
  return ofLength(vectors[0] ?? [], 9);
}

/**
 * Levenberg–Marquardt on the eight free entries of a homography h (h[8] = 1) taking (u, v) to (X, Y),
 * minimising Σ (X̂ − X)² + (Ŷ − Y)² with Marquardt's scaling of the damping by diag(JᵀJ). Every point
 * stays on the same side of the horizon as in the start (w > 0); a step that would cross it is refused.
 */
function refineProjective(h0: Mat3, pts: readonly Pair[], maxIterations = 50): Mat3 {
  const cost = (h: Mat3): number => {
    let sum = 0;
    for (const p of pts) {
      const w = h[6] * p.u + h[7] * p.v + 1;
      if (!(w > 0)) return Infinity;
      sum += ((h[0] * p.u + h[1] * p.v + h[2]) / w - p.X) ** 2 + ((h[3] * p.u + h[4] * p.v + h[5]) / w - p.Y) ** 2;
    }
    return sum;
  };
  let h = mat3(h0.map((x) => x / h0[8]));
  let c = cost(h);
  if (!Number.isFinite(c)) return h0;
  let lambda = 1e-3;
  for (let it = 0; it < maxIterations && c > 1e-30; it++) {
    const jacobian: number[][] = [];
    const residual: number[] = [];
    for (const p of pts) {
      const w = h[6] * p.u + h[7] * p.v + 1;
      const xh = (h[0] * p.u + h[1] * p.v + h[2]) / w;
      const yh = (h[3] * p.u + h[4] * p.v + h[5]) / w;
      jacobian.push([p.u / w, p.v / w, 1 / w, 0, 0, 0, (-xh * p.u) / w, (-xh * p.v) / w]);
      jacobian.push([0, 0, 0, p.u / w, p.v / w, 1 / w, (-yh * p.u) / w, (-yh * p.v) / w]);
      residual.push(xh - p.X, yh - p.Y);
    }
    const jt = new Matrix(jacobian).transpose();
    const jtj = jt.mmul(jt.transpose());
    const minusJtr = jt.mmul(Matrix.columnVector(residual)).mul(-1).getColumn(0);
    let improved = false;
    while (lambda < 1e12) {
      const damped = jtj
        .to2DArray()
        .map((row, a) => row.map((x, b) => (a === b ? x + lambda * Math.max(x, 1e-12) : x)));
      const step = ofLength(solveSquare(damped, minusJtr), 8);
      const next = step && mat3([...h.slice(0, 8).map((x, k) => x + (step[k] ?? NaN)), 1]);
      const cn = next ? cost(next) : Infinity;
      if (next && cn < c) {
        const gain = (c - cn) / c;
        [h, c, lambda] = [next, cn, Math.max(lambda / 10, 1e-12)];
        improved = gain > 1e-12;
        break;
      }
      lambda *= 10;
    }
    if (!improved) break;
  }
  return h;
}

/** Fits photo pixels to grid metres. Throws PhotoFitError naming the reason for a degenerate set. */
export function fitPhoto(
  points: readonly ControlPoint[],
  options: {
    model?: FitModel;
    /** Refine a projective fit in metres (default true); false keeps the DLT alone. */ refine?: boolean;
  } = {},
): PhotoFit {
  const model = options.model ?? modelForCount(points.length);
  assertUsable(points, model);
  const np = normaliser(points.map((p): XY => [p.px, p.py]));
  const ng = normaliser(points.map((p): XY => [p.x, p.y]));
  const pts = points.map((p): Pair => ({
    u: np.s * (p.px - np.cx),
    v: np.s * (p.py - np.cy),
    X: ng.s * (p.x - ng.cx),
    Y: ng.s * (p.y - ng.cy),
  }));
  const solve = model === "similarity" ? fitSimilarity : model === "affine" ? fitAffine : fitProjective;
  let inner = solve(pts);
  // The normalised grid is the metre grid scaled by ng.s, so least squares here is least squares in metres.
  if (inner && model === "projective" && options.refine !== false) inner = refineProjective(inner, pts);
  if (!inner)
    throw new PhotoFitError(
      "These control points do not fix the photo's position (too close to a line); spread them out.",
    );
  const product = mul3(normInverse(ng), mul3(inner, normMatrix(np)));
  const matrix = product.map((m) => m / product[8]);
  if (!matrix.every(Number.isFinite))
    throw new PhotoFitError("The fit sends part of the photo to infinity; check the control points.");
  const residuals = points.map((p) => {
    const [x, y] = applyFit(matrix, p.px, p.py);
    return Math.hypot(x - p.x, y - p.y);
  });
  const rms = Math.sqrt(residuals.reduce((s, r) => s + r * r, 0) / residuals.length);
  return { model, matrix, residuals, rms, redundancy: points.length - minimumPoints[model] };
}
