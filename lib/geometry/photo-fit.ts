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
import { invert3, leastSquares, solveSquare, symmetricEigen } from "./small-linalg";

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
  constructor(message: string, readonly points: number[] = []) {
    super(message);
    this.name = "PhotoFitError";
  }
}

export const minimumPoints: Record<FitModel, number> = { similarity: 2, affine: 3, projective: 4 };

export function modelForCount(n: number): FitModel {
  return n >= 4 ? "projective" : n === 3 ? "affine" : "similarity";
}

/** Where the fit puts photo pixel (px, py) on the grid. */
export function applyFit(matrix: readonly number[], px: number, py: number): [number, number] {
  const w = matrix[6] * px + matrix[7] * py + matrix[8];
  return [(matrix[0] * px + matrix[1] * py + matrix[2]) / w, (matrix[3] * px + matrix[4] * py + matrix[5]) / w];
}

/** The grid → photo matrix. */
export function invertFit(matrix: readonly number[]): number[] {
  const inv = invert3(matrix);
  if (!inv) throw new PhotoFitError("The fit cannot be inverted (it squashes the photo to a line).");
  return inv;
}

type Norm = { cx: number; cy: number; s: number };

/** Centroid to the origin, mean distance √2 (Hartley & Zisserman 2003, §4.4.4). */
function normaliser(xs: number[], ys: number[]): Norm {
  const n = xs.length;
  const cx = xs.reduce((a, b) => a + b, 0) / n;
  const cy = ys.reduce((a, b) => a + b, 0) / n;
  const mean = xs.reduce((a, x, i) => a + Math.hypot(x - cx, ys[i] - cy), 0) / n;
  return { cx, cy, s: Math.SQRT2 / mean };
}

const normMatrix = (t: Norm) => [t.s, 0, -t.s * t.cx, 0, t.s, -t.s * t.cy, 0, 0, 1];
const normInverse = (t: Norm) => [1 / t.s, 0, t.cx, 0, 1 / t.s, t.cy, 0, 0, 1];

function mul3(a: readonly number[], b: readonly number[]): number[] {
  const out = new Array<number>(9).fill(0);
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) for (let k = 0; k < 3; k++) out[3 * i + j] += a[3 * i + k] * b[3 * k + j];
  return out;
}

/** Twice the triangle's area over its longest side squared: 0 for three points on a line. */
function flatness(a: [number, number], b: [number, number], c: [number, number]): number {
  const cross = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
  const longest = Math.max((b[0] - a[0]) ** 2 + (b[1] - a[1]) ** 2, (c[0] - a[0]) ** 2 + (c[1] - a[1]) ** 2, (c[0] - b[0]) ** 2 + (c[1] - b[1]) ** 2);
  return Math.abs(cross) / longest;
}

/** Below this flatness three points count as collinear (a 0.1 % bulge on the longest side). */
const FLAT = 1e-3;

function allCollinear(pts: [number, number][]): boolean {
  for (let i = 0; i < pts.length; i++)
    for (let j = i + 1; j < pts.length; j++) for (let k = j + 1; k < pts.length; k++) if (flatness(pts[i], pts[j], pts[k]) >= FLAT) return false;
  return true;
}

function firstCollinearTriple(pts: [number, number][]): [number, number, number] | null {
  for (let i = 0; i < pts.length; i++)
    for (let j = i + 1; j < pts.length; j++) for (let k = j + 1; k < pts.length; k++) if (flatness(pts[i], pts[j], pts[k]) < FLAT) return [i, j, k];
  return null;
}

/** Refuses point sets that cannot fix the chosen model, naming the points (1-based). */
export function assertUsable(points: readonly ControlPoint[], model: FitModel): void {
  const need = minimumPoints[model];
  if (points.length < need) throw new PhotoFitError(`A ${model} fit needs at least ${need} control points; there are ${points.length}.`);
  for (const p of points) {
    if (![p.px, p.py, p.x, p.y].every(Number.isFinite)) throw new PhotoFitError("Every control point needs a photo position and finite grid coordinates.");
  }
  const photo = points.map((p) => [p.px, p.py] as [number, number]);
  const grid = points.map((p) => [p.x, p.y] as [number, number]);
  for (let i = 0; i < points.length; i++) {
    for (let j = i + 1; j < points.length; j++) {
      if (Math.hypot(photo[i][0] - photo[j][0], photo[i][1] - photo[j][1]) < 0.5) {
        throw new PhotoFitError(`Points ${i + 1} and ${j + 1} are on the same spot of the photo (duplicate points).`, [i, j]);
      }
      if (Math.hypot(grid[i][0] - grid[j][0], grid[i][1] - grid[j][1]) < 0.001) {
        throw new PhotoFitError(`Points ${i + 1} and ${j + 1} have the same grid position (duplicate points).`, [i, j]);
      }
    }
  }
  if (model === "similarity") return;
  for (const [set, where] of [[photo, "on the photo"], [grid, "on the grid"]] as const) {
    if (allCollinear(set)) throw new PhotoFitError(`All control points lie on one line ${where} (collinear); add a point off that line.`, points.map((_, i) => i));
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

function fitSimilarity(u: number[], v: number[], X: number[], Y: number[]): number[] | null {
  // x = a·px + b·py + tx, y = b·px − a·py + ty: rotation and scale with the photo's y axis mirrored.
  const rows: number[][] = [];
  const rhs: number[] = [];
  u.forEach((ui, i) => {
    rows.push([ui, v[i], 1, 0], [-v[i], ui, 0, 1]);
    rhs.push(X[i], Y[i]);
  });
  const s = leastSquares(rows, rhs);
  return s && [s[0], s[1], s[2], s[1], -s[0], s[3], 0, 0, 1];
}

function fitAffine(u: number[], v: number[], X: number[], Y: number[]): number[] | null {
  const rows = u.map((ui, i) => [ui, v[i], 1]);
  const a = leastSquares(rows, X);
  const b = leastSquares(rows, Y);
  return a && b && [...a, ...b, 0, 0, 1];
}

function fitProjective(u: number[], v: number[], X: number[], Y: number[]): number[] | null {
  const ata = Array.from({ length: 9 }, () => new Array<number>(9).fill(0));
  const add = (row: number[]) => {
    for (let i = 0; i < 9; i++) for (let j = 0; j < 9; j++) ata[i][j] += row[i] * row[j];
  };
  u.forEach((ui, i) => {
    add([-ui, -v[i], -1, 0, 0, 0, ui * X[i], v[i] * X[i], X[i]]);
    add([0, 0, 0, -ui, -v[i], -1, ui * Y[i], v[i] * Y[i], Y[i]]);
  });
  const { values, vectors } = symmetricEigen(ata);
  // A second near-zero eigenvalue means a family of solutions: the points do not fix the homography.
  if (values[1] <= 1e-10 * Math.max(values[8], 1e-300)) return null;
  return vectors[0];
}

/**
 * Levenberg–Marquardt on the eight free entries of a homography h (h[8] = 1) taking (u, v) to (X, Y),
 * minimising Σ (X̂ − X)² + (Ŷ − Y)² with Marquardt's scaling of the damping by diag(JᵀJ). Every point
 * stays on the same side of the horizon as in the start (w > 0); a step that would cross it is refused.
 */
function refineProjective(h0: number[], u: number[], v: number[], X: number[], Y: number[], maxIterations = 50): number[] {
  const n = u.length;
  const cost = (h: number[]): number => {
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const w = h[6] * u[i] + h[7] * v[i] + 1;
      if (!(w > 0)) return Infinity;
      sum += ((h[0] * u[i] + h[1] * v[i] + h[2]) / w - X[i]) ** 2 + ((h[3] * u[i] + h[4] * v[i] + h[5]) / w - Y[i]) ** 2;
    }
    return sum;
  };
  let h = h0.map((x) => x / h0[8]);
  let c = cost(h);
  if (!Number.isFinite(c)) return h0;
  let lambda = 1e-3;
  for (let it = 0; it < maxIterations && c > 1e-30; it++) {
    const jtj = Array.from({ length: 8 }, () => new Array<number>(8).fill(0));
    const jtr = new Array<number>(8).fill(0);
    const accumulate = (row: number[], r: number) => {
      for (let a = 0; a < 8; a++) {
        if (row[a] === 0) continue;
        jtr[a] += row[a] * r;
        for (let b = 0; b < 8; b++) jtj[a][b] += row[a] * row[b];
      }
    };
    for (let i = 0; i < n; i++) {
      const w = h[6] * u[i] + h[7] * v[i] + 1;
      const xh = (h[0] * u[i] + h[1] * v[i] + h[2]) / w;
      const yh = (h[3] * u[i] + h[4] * v[i] + h[5]) / w;
      accumulate([u[i] / w, v[i] / w, 1 / w, 0, 0, 0, (-xh * u[i]) / w, (-xh * v[i]) / w], xh - X[i]);
      accumulate([0, 0, 0, u[i] / w, v[i] / w, 1 / w, (-yh * u[i]) / w, (-yh * v[i]) / w], yh - Y[i]);
    }
    let improved = false;
    while (lambda < 1e12) {
      const damped = jtj.map((row, a) => row.map((x, b) => (a === b ? x + lambda * Math.max(x, 1e-12) : x)));
      const step = solveSquare(damped, jtr.map((g) => -g));
      const next = step && [...h.slice(0, 8).map((x, k) => x + step[k]), 1];
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
export function fitPhoto(points: readonly ControlPoint[], options: { model?: FitModel; /** Refine a projective fit in metres (default true); false keeps the DLT alone. */ refine?: boolean } = {}): PhotoFit {
  const model = options.model ?? modelForCount(points.length);
  assertUsable(points, model);
  const np = normaliser(points.map((p) => p.px), points.map((p) => p.py));
  const ng = normaliser(points.map((p) => p.x), points.map((p) => p.y));
  const u = points.map((p) => np.s * (p.px - np.cx));
  const v = points.map((p) => np.s * (p.py - np.cy));
  const X = points.map((p) => ng.s * (p.x - ng.cx));
  const Y = points.map((p) => ng.s * (p.y - ng.cy));
  const solve = model === "similarity" ? fitSimilarity : model === "affine" ? fitAffine : fitProjective;
  let inner = solve(u, v, X, Y);
  // The normalised grid is the metre grid scaled by ng.s, so least squares here is least squares in metres.
  if (inner && model === "projective" && options.refine !== false) inner = refineProjective(inner, u, v, X, Y);
  if (!inner) throw new PhotoFitError("These control points do not fix the photo's position (too close to a line); spread them out.");
  let matrix = mul3(normInverse(ng), mul3(inner, normMatrix(np)));
  matrix = matrix.map((m) => m / matrix[8]);
  if (!matrix.every(Number.isFinite)) throw new PhotoFitError("The fit sends part of the photo to infinity; check the control points.");
  const residuals = points.map((p) => {
    const [x, y] = applyFit(matrix, p.px, p.py);
    return Math.hypot(x - p.x, y - p.y);
  });
  const rms = Math.sqrt(residuals.reduce((s, r) => s + r * r, 0) / residuals.length);
  return { model, matrix, residuals, rms, redundancy: points.length - minimumPoints[model] };
}
