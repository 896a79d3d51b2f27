/**
 * The few dense linear-algebra steps the photo fit needs (at most 9 unknowns), through ml-matrix. These
 * wrappers keep the photo fit's plain-array shapes and its rule that a singular system gives null (the
 * caller then says the control points do not fix the photo) rather than a solution of huge numbers.
 */
import { EigenvalueDecomposition, LuDecomposition, Matrix } from "ml-matrix";

/** A fixed-length list of numbers, so that its entries can be read without a missing case. */
export type Tuple<N extends number, R extends number[] = []> = R["length"] extends N ? R : Tuple<N, [...R, number]>;

/** The list as a tuple of length n, or null when it is missing or has another length. */
export function ofLength<N extends number>(list: readonly number[] | null | undefined, n: N): Tuple<N> | null {
  return list && list.length === n ? (list.slice() as unknown as Tuple<N>) : null;
}

/** Solves the square system M x = r (LU with partial pivoting); null when M is singular to working precision. */
export function solveSquare(m: number[][], r: number[]): number[] | null {
  if (m.length === 0 || m.length !== r.length) return null;
  const lu = new LuDecomposition(new Matrix(m));
  const scale = Math.max(1e-300, ...m.flat().map(Math.abs));
  const u = lu.upperTriangularMatrix;
  for (let i = 0; i < r.length; i++) if (!(Math.abs(u.get(i, i)) > 1e-12 * scale)) return null;
  return lu.solve(Matrix.columnVector(r)).getColumn(0);
}

/** Least squares: minimises |A x − b|² through the normal equations AᵀA x = Aᵀb (well-conditioned inputs only). */
export function leastSquares(rows: number[][], b: number[]): number[] | null {
  if (rows.length === 0 || rows.length !== b.length) return null;
  const a = new Matrix(rows);
  const at = a.transpose();
  return solveSquare(at.mmul(a).to2DArray(), at.mmul(Matrix.columnVector(b)).getColumn(0));
}

/** Eigen-decomposition of a symmetric matrix: eigenvalues ascending with their unit eigenvectors. */
export function symmetricEigen(input: number[][]): { values: number[]; vectors: number[][] } {
  const e = new EigenvalueDecomposition(new Matrix(input), { assumeSymmetric: true });
  const values = e.realEigenvalues;
  const v = e.eigenvectorMatrix;
  const order = values.map((value, i) => ({ value, i })).sort((x, y) => x.value - y.value);
  return {
    values: order.map((o) => o.value),
    vectors: order.map((o) => {
      const col = v.getColumn(o.i);
      const norm = Math.hypot(...col) || 1;
      return col.map((x) => x / norm);
    }),
  };
}

/** Inverse of a 3×3 matrix given row-major; null when singular. */
export function invert3(m: readonly number[]): number[] | null {
  if (m.length !== 9) return null;
  const rows = [m.slice(0, 3), m.slice(3, 6), m.slice(6, 9)];
  const identity = [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ];
  const cols = identity.map((e) => solveSquare(rows, e));
  if (cols.some((c) => c === null || c.some((x) => !Number.isFinite(x)))) return null;
  const [c0, c1, c2] = cols.map((c) => ofLength(c, 3));
  if (!c0 || !c1 || !c2) return null;
  return [c0[0], c1[0], c2[0], c0[1], c1[1], c2[1], c0[2], c1[2], c2[2]];
}
