import { intersection } from "polyclip-ts";
import type { GridSquare } from "./square-grid";

type Pt = [number, number];

/**
 * A square as the trench cuts it: the boundary of (square ∩ outline) minus the holes, as exact polygon
 * clipping (polyclip-ts, Martínez–Rueda–Feito) rather than the area-only clipping of `clipSquares`, whose
 * Sutherland–Hodgman pass can leave zero-width slivers along a square's edge. Read by the square-count
 * tests: contiguity from the clipped shapes (two squares are rook neighbours only if their clipped shapes
 * still share a stretch of edge) and distance bands between the clipped shapes' centroids.
 */
export type SquareShape = {
  /** Every ring of every piece: each piece's outer ring, then its holes. */
  rings: Pt[][];
  /** The area centroid of the clipped square (the square's centre when it is whole). */
  centroid: Pt;
};

/** Twice the signed area and the first moments of a ring (the shoelace formula and its centroid form). */
function moments(ring: readonly Pt[]): { a2: number; mx: number; my: number } {
  const [ox, oy] = ring[0]!;
  let a2 = 0;
  let mx = 0;
  let my = 0;
  for (let k = 0; k < ring.length; k++) {
    const [ax, ay] = ring[k]!;
    const [bx, by] = ring[(k + 1) % ring.length]!;
    const cross = (ax - ox) * (by - oy) - (bx - ox) * (ay - oy);
    a2 += cross;
    mx += (ax - ox + (bx - ox)) * cross;
    my += (ay - oy + (by - oy)) * cross;
  }
  // centroid of the ring = origin + (mx, my) / (3 a2); returned in absolute terms below
  return { a2, mx: mx / 3 + ox * a2, my: my / 3 + oy * a2 };
}

/**
 * The centroid of polygons with holes: each piece's outer ring counts with its area, each hole against it,
 * whatever way the rings wind.
 */
export function polygonsCentroid(pieces: readonly (readonly Pt[])[][]): Pt | null {
  let area = 0;
  let sx = 0;
  let sy = 0;
  for (const piece of pieces) {
    piece.forEach((ring, k) => {
      if (ring.length < 3) return;
      const m = moments(ring);
      if (m.a2 === 0) return;
      // |A| for the outer ring, −|A| for a hole: the signs of a2, mx, my flip together with the winding.
      const sign = (k === 0 ? 1 : -1) * Math.sign(m.a2);
      area += (sign * m.a2) / 2;
      sx += (sign * m.mx) / 2;
      sy += (sign * m.my) / 2;
    });
  }
  return area > 0 ? [sx / area, sy / area] : null;
}

export function clippedSquareShape(
  window: { outer: readonly Pt[]; holes: readonly (readonly Pt[])[] },
  sq: Pick<GridSquare, "x0" | "y0" | "x1" | "y1" | "whole">,
): SquareShape {
  const square: Pt[] = [
    [sq.x0, sq.y0],
    [sq.x1, sq.y0],
    [sq.x1, sq.y1],
    [sq.x0, sq.y1],
  ];
  const centre: Pt = [(sq.x0 + sq.x1) / 2, (sq.y0 + sq.y1) / 2];
  if (sq.whole) return { rings: [square], centroid: centre };
  const trench = [window.outer, ...window.holes].map((r) => r.map((p) => [p[0], p[1]] as Pt));
  const pieces = intersection(trench, [square]);
  return { rings: pieces.flat(), centroid: polygonsCentroid(pieces) ?? centre };
}
