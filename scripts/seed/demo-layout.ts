import { createWindow, createRandom, type Random, type Window, type WindowInput } from "@/lib/spatial";

/**
 * Seeded layouts of the demo site's finds (invented data, for the demo only): a clustered class, one that
 * follows it, an evenly spread class and a random one, so every Loamwork test has something to find.
 */
export type Pt = [number, number];

function uniform(w: Window, rng: Random): Pt {
  for (;;) {
    const x = w.bbox.minX + rng.next() * (w.bbox.maxX - w.bbox.minX);
    const y = w.bbox.minY + rng.next() * (w.bbox.maxY - w.bbox.minY);
    if (w.contains(x, y) && w.boundaryDistance(x, y) > 0.02) return [x, y];
  }
}

function gaussian(rng: Random): number {
  // Box–Muller transform.
  const u = Math.max(rng.next(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rng.next());
}

/** Complete spatial randomness: n independent uniform points. */
export function randomLayout(w: Window, n: number, rng: Random): Pt[] {
  return Array.from({ length: n }, () => uniform(w, rng));
}

/** A Thomas-type cluster layout around given parent centres (offspring Gaussian with sd sigma), kept inside W. */
export function clusteredLayout(w: Window, n: number, centres: Pt[], sigma: number, rng: Random): Pt[] {
  const out: Pt[] = [];
  while (out.length < n) {
    const c = centres[rng.int(centres.length)];
    const x = c[0] + sigma * gaussian(rng);
    const y = c[1] + sigma * gaussian(rng);
    if (w.contains(x, y) && w.boundaryDistance(x, y) > 0.02) out.push([x, y]);
  }
  return out;
}

/** Simple sequential inhibition: uniform points, each kept only if no kept point lies within `gap`. */
export function evenLayout(w: Window, n: number, gap: number, rng: Random): Pt[] {
  const out: Pt[] = [];
  for (let tries = 0; out.length < n && tries < 200_000; tries++) {
    const p = uniform(w, rng);
    if (out.every((q) => (q[0] - p[0]) ** 2 + (q[1] - p[1]) ** 2 >= gap * gap)) out.push(p);
  }
  if (out.length < n) throw new Error(`evenLayout: only ${out.length} of ${n} points fit at a gap of ${gap} m`);
  return out;
}

export function windowOf(input: WindowInput): Window {
  return createWindow(input);
}

export { createRandom };
