/**
 * The few dense linear-algebra steps the photo fit needs (at most 9 unknowns), written out rather than
 * pulling in a matrix library for the browser bundle.
 */

/** Solves the square system M x = r by Gaussian elimination with partial pivoting; null when M is singular. */
export function solveSquare(m: number[][], r: number[]): number[] | null {
  const n = r.length;
  const a = m.map((row, i) => [...row, r[i]]);
  const scale = Math.max(1e-300, ...m.flat().map(Math.abs));
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let row = col + 1; row < n; row++) if (Math.abs(a[row][col]) > Math.abs(a[pivot][col])) pivot = row;
    if (Math.abs(a[pivot][col]) <= 1e-12 * scale) return null;
    [a[col], a[pivot]] = [a[pivot], a[col]];
    for (let row = 0; row < n; row++) {
      if (row === col) continue;
      const f = a[row][col] / a[col][col];
      if (f === 0) continue;
      for (let k = col; k <= n; k++) a[row][k] -= f * a[col][k];
    }
  }
  return a.map((row, i) => row[n] / row[i]);
}

/** Least squares: minimises |A x − b|² through the normal equations AᵀA x = Aᵀb (well-conditioned inputs only). */
export function leastSquares(rows: number[][], b: number[]): number[] | null {
  const n = rows[0].length;
  const ata = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const atb = new Array<number>(n).fill(0);
  rows.forEach((row, k) => {
    for (let i = 0; i < n; i++) {
      atb[i] += row[i] * b[k];
      for (let j = 0; j < n; j++) ata[i][j] += row[i] * row[j];
    }
  });
  return solveSquare(ata, atb);
}

/**
 * Eigen-decomposition of a symmetric matrix by cyclic Jacobi rotations (Golub & Van Loan, Matrix
 * Computations, 4th ed., §8.5). Returns eigenvalues ascending with their unit eigenvectors.
 */
export function symmetricEigen(input: number[][]): { values: number[]; vectors: number[][] } {
  const n = input.length;
  const a = input.map((row) => [...row]);
  const v: number[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += a[p][q] * a[p][q];
    if (off < 1e-30) break;
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        if (Math.abs(a[p][q]) < 1e-300) continue;
        const theta = (a[q][q] - a[p][p]) / (2 * a[p][q]);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k][p];
          const akq = a[k][q];
          a[k][p] = c * akp - s * akq;
          a[k][q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p][k];
          const aqk = a[q][k];
          a[p][k] = c * apk - s * aqk;
          a[q][k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k][p];
          const vkq = v[k][q];
          v[k][p] = c * vkp - s * vkq;
          v[k][q] = s * vkp + c * vkq;
        }
      }
    }
  }
  const order = a.map((row, i) => [row[i], i] as const).sort((x, y) => x[0] - y[0]);
  return { values: order.map(([val]) => val), vectors: order.map(([, i]) => v.map((row) => row[i])) };
}

/** Inverse of a 3×3 matrix given row-major; null when singular. */
export function invert3(m: readonly number[]): number[] | null {
  const [a, b, c, d, e, f, g, h, i] = m;
  const A = e * i - f * h;
  const B = -(d * i - f * g);
  const C = d * h - e * g;
  const det = a * A + b * B + c * C;
  if (!Number.isFinite(det) || Math.abs(det) < 1e-300) return null;
  return [A, -(b * i - c * h), b * f - c * e, B, a * i - c * g, -(a * f - c * d), C, -(a * h - b * g), a * e - b * d].map((x) => x / det);
}
