/**
 * The prepared set covariance gives the overlap edge-translation.ts sums directly, to rounding, everywhere
 * within its reach: at random displacements, at displacements where one ring's vertex lies on the other's
 * edge or edges overlap (where the cases of its pieces change), and with the window anywhere on the site
 * grid. Fixed seeds, bounded runs.
 */
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { DEMO_TRENCH } from "./demo-window";
import { setCovariance, translationPairWeights } from "./edge-translation";
import { pairsWithin } from "./neighbours";
import {
  createSetCovarianceTable,
  runSetCovarianceTable,
  setCovarianceTableFor,
  type SetCovarianceTable,
} from "./set-covariance-table";
import { createRandom } from "../random/random";
import { createWindowSampler } from "../random/sample-window";
import { createWindow } from "./window";
import type { Ring, Window, WindowInput } from "../types";

/** A pit with many sides: a wobbly 40-gon (no two edges parallel, no axis-aligned edge). */
function pit(sides: number, cx = 3, cy = 2): WindowInput {
  const outer: Ring = [];
  for (let k = 0; k < sides; k++) {
    const a = (2 * Math.PI * k) / sides;
    const rad = 1 + 0.15 * Math.sin(3 * a) + 0.05 * Math.cos(7 * a);
    outer.push([cx + 2.2 * rad * Math.cos(a), cy + 1.6 * rad * Math.sin(a)]);
  }
  return { outer };
}

function shifted(input: WindowInput, sx: number, sy: number): WindowInput {
  const move = (r: Ring): Ring => r.map(([x, y]) => [x + sx, y + sy]);
  return { outer: move(input.outer), holes: (input.holes ?? []).map(move) };
}

const RECT: WindowInput = {
  outer: [
    [0, 0],
    [6, 0],
    [6, 4],
    [0, 4],
  ],
};

const cases: [string, WindowInput, number][] = [
  ["the demo trench with its baulk", DEMO_TRENCH, 2],
  ["a pit with 40 sides", pit(40), 1.2],
  ["a rectangle", RECT, 1],
];

/** |table − direct| relative to |W|: 1e-12 is far inside the 1e-9 the estimators are held to. */
const tables = new Map<Window, SetCovarianceTable>();
function worstOver(win: Window, reach: number, vs: [number, number][]): number {
  let table = tables.get(win);
  if (!table) tables.set(win, (table = createSetCovarianceTable(win, reach)!));
  let worst = 0;
  for (const [dx, dy] of vs)
    worst = Math.max(worst, Math.abs(table.at(dx, dy) - setCovariance(win, dx, dy)) / win.area);
  return worst;
}

/** Displacements where a vertex of W + v lies on an edge of W or vertices meet: the pieces' case lines. */
function caseLineDisplacements(win: Window, reach: number): [number, number][] {
  const out: [number, number][] = [];
  const { edges, edgeCount } = win;
  for (let a = 0; a < edgeCount; a++) {
    const px = edges[4 * a],
      py = edges[4 * a + 1];
    for (let e = 0; e < edgeCount; e++) {
      for (const t of [0, 0.25, 0.5, 1]) {
        const qx = edges[4 * e] + t * (edges[4 * e + 2] - edges[4 * e]);
        const qy = edges[4 * e + 1] + t * (edges[4 * e + 3] - edges[4 * e + 1]);
        const dx = qx - px,
          dy = qy - py;
        if (Math.abs(dx) <= reach && Math.abs(dy) <= reach) out.push([dx, dy], [-dx, -dy]);
      }
    }
  }
  return out;
}

describe("set covariance prepared for a run", () => {
  test.each(cases)("equals the direct overlap sum at random displacements in %s", (_, input, reach) => {
    const win = createWindow(input);
    const v = fc.double({ min: -reach, max: reach, noNaN: true, noDefaultInfinity: true });
    fc.assert(
      fc.property(fc.array(fc.tuple(v, v), { minLength: 200, maxLength: 200 }), (vs) => {
        expect(worstOver(win, reach, vs)).toBeLessThan(1e-12);
      }),
      { seed: 18, numRuns: 5 },
    );
  });

  test.each(cases)("equals it where vertices meet edges and on the axes in %s", (_, input, reach) => {
    const win = createWindow(input);
    const vs = caseLineDisplacements(win, reach);
    for (const t of [-1, -0.5, -1e-9, 0, 1e-9, 0.5, 1]) vs.push([t * reach, 0], [0, t * reach], [t * reach, t * reach]);
    expect(vs.length).toBeGreaterThan(20);
    expect(worstOver(win, reach, vs)).toBeLessThan(1e-12);
  });

  test("does not depend on where the trench lies on the site grid", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(0.1, 1000.37, -250.3),
        fc.constantFrom(0.1, 1000.37, 5e3 + 0.7),
        fc.integer({ min: 0, max: 1 }),
        (sx, sy, which) => {
          const input = which === 0 ? DEMO_TRENCH : pit(40);
          const win = createWindow(shifted(input, sx, sy));
          const reach = which === 0 ? 2 : 1.2;
          const vs: [number, number][] = [];
          for (let k = 0; k < 100; k++) vs.push([reach * Math.cos(k * 2.4), reach * Math.sin(k * 1.3) * 0.9]);
          expect(worstOver(win, reach, vs)).toBeLessThan(1e-12);
        },
      ),
      { seed: 7, numRuns: 6 },
    );
  });

  test("beyond its reach falls back to the direct sum, and is even in v", () => {
    const win = createWindow(DEMO_TRENCH);
    const table = createSetCovarianceTable(win, 1)!;
    expect(table.at(3, 1.5)).toBe(setCovariance(win, 3, 1.5));
    expect(table.at(0.3, -0.7)).toBe(table.at(-0.3, 0.7));
    expect(table.at(0, 0)).toBeCloseTo(win.area, 10);
  });

  test("is not prepared when the window has too many edges for the work bound", () => {
    const win = createWindow(pit(40));
    expect(createSetCovarianceTable(win, 1.2, { budget: 1000 })).toBeNull();
  });
});

describe("translation weights of many pairs", () => {
  test("come from the prepared table and equal the direct overlap's", () => {
    const win = createWindow(pit(40));
    const n = 400;
    const x = new Float64Array(n),
      y = new Float64Array(n);
    createWindowSampler(win).fill(createRandom(3), n, x, y);
    const pairs = pairsWithin({ x, y }, 1.2);
    // enough pairs × edge pairs for the table to pay (edge-translation.ts)
    expect(pairs.count * 40 * 40).toBeGreaterThan(2e7);
    const w = translationPairWeights(win, x, y, x, y, pairs);
    let worst = 0;
    for (let p = 0; p < pairs.count; p++) {
      const i = pairs.i[p],
        j = pairs.j[p];
      const direct = win.area / setCovariance(win, x[j] - x[i], y[j] - y[i]);
      worst = Math.max(worst, Math.abs(w[p] - direct) / direct);
    }
    expect(worst).toBeLessThan(1e-12);
    // the window keeps its table: a second call does not prepare another
    expect(setCovarianceTableFor(win, 1)).toBe(setCovarianceTableFor(win, 1.1));
  });

  test("a run's table is kept by outline and reach, and is the one a fresh preparation gives", () => {
    // each run builds its own Window from the stored outline: the second run in the trench finds the table
    const first = runSetCovarianceTable(createWindow(DEMO_TRENCH), 2);
    expect(first).not.toBeNull();
    expect(runSetCovarianceTable(createWindow(DEMO_TRENCH), 2)).toBe(first);
    // another reach or another outline is another table, never a neighbour's
    expect(runSetCovarianceTable(createWindow(DEMO_TRENCH), 1.9)).not.toBe(first);
    const moved = runSetCovarianceTable(createWindow(shifted(DEMO_TRENCH, 0.1, 0)), 2);
    expect(moved).not.toBe(first);
    expect(moved!.at(0.5, 0.25)).toBeCloseTo(first!.at(0.5, 0.25), 12);
    // the same numbers as a table prepared afresh, bit for bit
    const fresh = createSetCovarianceTable(createWindow(DEMO_TRENCH), 2)!;
    expect(Array.from(first!.cell)).toEqual(Array.from(fresh.cell));
    expect(first!.listed).toBe(fresh.listed);
  });
});
