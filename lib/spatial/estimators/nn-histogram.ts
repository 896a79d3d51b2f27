/**
 * The distribution of nearest-neighbour distances as a histogram, the picture beside the Clark–Evans test:
 * equal-width bins from 0 to the largest distance, their number by Sturges' rule, ⌈log₂ n + 1⌉ bins for n
 * distances (Sturges 1926, J. Am. Stat. Assoc. 21:65–66). A distance on a bin's upper edge counts in the
 * next bin up; the largest distance counts in the last bin.
 */
import { nearestNeighbourDistances } from "../geometry/neighbours";
import type { Points } from "../types";

export interface NNHistogram {
  /** bins + 1 edges from 0 (m). */
  edges: number[];
  counts: number[];
}

export function nnHistogram(points: Points): NNHistogram {
  const d = nearestNeighbourDistances(points);
  const bins = Math.ceil(Math.log2(d.length) + 1);
  let top = 0;
  for (const v of d) top = Math.max(top, v);
  // All finds on one spot: one bin of width 1 m rather than bins of no width.
  const width = (top || 1) / bins;
  const counts = new Array<number>(bins).fill(0);
  for (const v of d) {
    const b = Math.min(bins - 1, Math.floor(v / width));
    counts[b] = (counts[b] ?? 0) + 1;
  }
  return { edges: Array.from({ length: bins + 1 }, (_, k) => k * width), counts };
}
