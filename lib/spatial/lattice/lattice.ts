/**
 * From the squares as recorded to the units the tests run on. Squares with no excavated area are not units
 * (statistics.md: "Squares with no excavated area are not units"), nor those below `minArea` (counts of
 * tiny slivers at the edge are unstable). How edge squares are weighted by area: the Moran, Geary and
 * Getis–Ord formulas of Cliff & Ord and Ord & Getis treat every unit alike and have no place for an area
 * weight, so Loamwork tests the density (count per excavated m², the default variable: the count over
 * the area dug, summed over the records in scope), which puts a square half cut away by the outline, or
 * dug in more spits, on the same footing as a whole one; the minimum area drops the slivers whose density
 * rests on a few cm². Where the neighbours allow it, the cut itself counts: contiguity "from the shapes"
 * reads the squares as clipped (a square the outline separates from the next is not its neighbour) and a
 * distance band measures from the centres given (the app passes the clipped squares' centroids). The
 * weights themselves are binary or row-standardised, not area-scaled.
 */
import { SpatialInputError } from "../errors";
import { distanceBand, gridContiguity, shapeContiguity, toNeighbourList } from "./neighbours";
import type {
  Lattice,
  LatticeInput,
  LatticeSquare,
  LatticeVariable,
  LeftOutSquare,
  NeighbourList,
  NeighbourRule,
} from "./types";

export interface LatticeOptions {
  /** The neighbour rule ["queen" from the grid]. */
  neighbours?: NeighbourRule;
  /** The variable tested ["density"]. */
  variable?: LatticeVariable;
  /** Squares with less excavated area (m²) are left out [0: only squares with no area]. */
  minArea?: number;
  /** Units left with no neighbours: refuse with an error naming them ["refuse"], or leave them out ("drop"). */
  isolated?: "refuse" | "drop";
  /** Contiguity from shapes: how close (m) two boundaries must come to touch [1e-6]. */
  tolerance?: number;
}

export function describeRule(rule: NeighbourRule): string {
  if (rule.type === "distance") {
    const lo = rule.lower ? `${rule.lower} to ` : "up to ";
    return `square centres ${lo}${rule.upper} m apart`;
  }
  const what = rule.type === "rook" ? "rook contiguity (a shared edge)" : "queen contiguity (a shared edge or corner)";
  return `${what}, ${rule.from === "shapes" ? "from the clipped squares" : "on the grid"}`;
}

function checkSquare(s: LatticeSquare, k: number, seen: Set<string>): void {
  if (!s || typeof s.id !== "string" || s.id.length === 0) throw new SpatialInputError(`Square ${k + 1} has no id.`);
  if (seen.has(s.id)) throw new SpatialInputError(`Square ${s.id} appears twice.`);
  seen.add(s.id);
  if (typeof s.area !== "number" || !Number.isFinite(s.area) || s.area < 0) {
    throw new SpatialInputError(
      `Square ${s.id}: the excavated area must be a number of m², 0 or more; got ${String(s.area)}.`,
    );
  }
  if (typeof s.value !== "number" || !Number.isFinite(s.value))
    throw new SpatialInputError(`Square ${s.id}: the count is not a number (${String(s.value)}).`);
  if (s.value < 0)
    throw new SpatialInputError(
      `Square ${s.id}: the count is negative (${s.value}); counts and weights are 0 or more.`,
    );
  if (s.area === 0 && s.value > 0)
    throw new SpatialInputError(`Square ${s.id} has ${s.value} counted but no excavated area.`);
}

function neighboursOf(squares: LatticeSquare[], rule: NeighbourRule, tolerance: number): NeighbourList {
  if (rule.type === "distance") return distanceBand(squares, rule.upper, rule.lower ?? 0);
  if (rule.type !== "rook" && rule.type !== "queen")
    throw new SpatialInputError(`Unknown neighbour rule "${String((rule as { type: unknown }).type)}".`);
  return rule.from === "shapes" ? shapeContiguity(squares, rule.type, tolerance) : gridContiguity(squares, rule.type);
}

/** Keep units `keep` (increasing) of a neighbour list, renumbered. */
function subsetNeighbours(nb: NeighbourList, keep: number[]): NeighbourList {
  const newIndex = new Int32Array(nb.n).fill(-1);
  keep.forEach((i, k) => (newIndex[i] = k));
  const sets = keep.map((i) => {
    const s = new Set<number>();
    for (let p = nb.start[i]; p < nb.start[i + 1]; p++) if (newIndex[nb.index[p]] >= 0) s.add(newIndex[nb.index[p]]);
    return s;
  });
  return toNeighbourList(sets);
}

/** Validate the squares, leave out those with no (or too little) area, and find the neighbours. */
export function buildLattice(input: LatticeInput, options: LatticeOptions = {}): Lattice {
  const rule: NeighbourRule = options.neighbours ?? { type: "queen", from: "grid" };
  const variable = options.variable ?? "density";
  const minArea = options.minArea ?? 0;
  const tolerance = options.tolerance ?? 1e-6;
  if (variable !== "density" && variable !== "count")
    throw new SpatialInputError(`The variable must be "density" or "count"; got ${String(variable)}.`);
  if (!(Number.isFinite(minArea) && minArea >= 0))
    throw new SpatialInputError(`The minimum area must be 0 m² or more; got ${minArea}.`);
  if (!(Number.isFinite(tolerance) && tolerance >= 0))
    throw new SpatialInputError(`The tolerance must be 0 m or more; got ${tolerance}.`);
  const squares = input?.squares;
  if (!Array.isArray(squares) || squares.length === 0)
    throw new SpatialInputError("The grid has no squares with counts: there is nothing to test.");
  const seen = new Set<string>();
  squares.forEach((s, k) => checkSquare(s, k, seen));
  const leftOut: LeftOutSquare[] = [];
  const units = squares.filter((s) => {
    if (s.area === 0) leftOut.push({ id: s.id, reason: "not excavated" });
    else if (s.area < minArea) leftOut.push({ id: s.id, reason: "below the minimum area" });
    else return true;
    return false;
  });
  if (units.length === 0) {
    throw new SpatialInputError(
      minArea > 0
        ? `No square has at least ${minArea} m² excavated: the grid leaves no square to test.`
        : "No square has excavated area: the grid leaves no square to test.",
    );
  }
  let nb = neighboursOf(units, rule, tolerance);
  let kept = units;
  const lonely = units.filter((_, i) => nb.start[i + 1] === nb.start[i]);
  if (lonely.length > 0) {
    if ((options.isolated ?? "refuse") === "refuse") {
      const names =
        lonely
          .slice(0, 5)
          .map((s) => s.id)
          .join(", ") + (lonely.length > 5 ? ` and ${lonely.length - 5} more` : "");
      throw new SpatialInputError(
        `${lonely.length === 1 ? "Square" : "Squares"} ${names} ${lonely.length === 1 ? "has" : "have"} no neighbours under ${describeRule(rule)}: widen the neighbour rule, or leave such squares out.`,
      );
    }
    const keep = units.map((_, i) => i).filter((i) => nb.start[i + 1] > nb.start[i]);
    lonely.forEach((s) => leftOut.push({ id: s.id, reason: "no neighbours" }));
    nb = subsetNeighbours(nb, keep);
    kept = keep.map((i) => units[i]);
  }
  if (kept.length === 0)
    throw new SpatialInputError(`No square has a neighbour under ${describeRule(rule)}: widen the neighbour rule.`);
  return {
    ids: kept.map((s) => s.id),
    values: Float64Array.from(kept, (s) => (variable === "density" ? s.value / s.area : s.value)),
    areas: Float64Array.from(kept, (s) => s.area),
    variable,
    neighbours: nb,
    rule,
    leftOut,
    describe: describeRule(rule),
  };
}
