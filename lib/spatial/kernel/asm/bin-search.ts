/** Shared by the AssemblyScript kernels (inlined into each). */

/** spatstat's whist rule (r-grid.ts createBinner): smallest k with d < r[k]; d = r[m−1] in bin m−1. */
@inline export function binSearch(d: f64, pR: usize, m: i32): i32 {
  const last = load<f64>(pR + ((<usize>(m - 1)) << 3));
  if (d > last) return m;
  if (d == last) return m - 1;
  let lo: i32 = 0;
  let hi: i32 = m - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (load<f64>(pR + ((<usize>mid) << 3)) > d) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}
