/**
 * The false discovery rate across squares (Benjamini & Hochberg 1995, JRSS B 57:289–300): with m local
 * tests, the k-th smallest p-value is adjusted to min over j ≥ k of p_(j) · m / j, capped at 1 — R's
 * p.adjust(p, "BH"). A square is a hot or cold spot at level q when its adjusted p-value is at most q; the
 * expected share of false ones among those found is then at most q.
 */
export function benjaminiHochberg(p: ArrayLike<number>): Float64Array {
  const m = p.length;
  const order = Array.from({ length: m }, (_, k) => k).sort((a, b) => p[b] - p[a]);
  const out = new Float64Array(m);
  let running = 1;
  order.forEach((idx, r) => {
    const rank = m - r; // rank of p[idx] from the smallest, 1-based
    running = Math.min(running, (p[idx] * m) / rank);
    out[idx] = Math.min(1, running);
  });
  return out;
}
