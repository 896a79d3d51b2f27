import { boundsOf } from "@/lib/geometry/plan-view";
import type { PolygonJson } from "@/lib/server/reads/row-types";

/** A small static drawing of a trench outline (holes shown as paper), for lists and the overview. */
export function OutlineSketch({ outline, size = 120 }: { outline: PolygonJson; size?: number }) {
  const { minX, maxX, minY, maxY } = boundsOf(outline.coordinates.flat());
  const span = Math.max(maxX - minX, maxY - minY) || 1;
  const pad = span * 0.05;
  // Site grid north is up: flip y for the screen.
  const d = outline.coordinates
    .map((ring) => "M" + ring.map(([x, y]) => `${(x - minX).toFixed(3)},${(maxY - y).toFixed(3)}`).join("L") + "Z")
    .join(" ");
  return (
    <svg
      viewBox={`${-pad} ${-pad} ${span + 2 * pad} ${span + 2 * pad}`}
      width={size}
      height={size}
      role="img"
      aria-label="Trench outline"
    >
      <path d={d} fill="#c9b28a" fillRule="evenodd" stroke="#2e2116" strokeWidth={span / 100} />
    </svg>
  );
}
