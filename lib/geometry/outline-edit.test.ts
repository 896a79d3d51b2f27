import { describe, expect, it } from "vitest";
import { checkOutline } from "./outline";
import {
  deleteVertex,
  insertVertex,
  locateProblem,
  moveVertex,
  nearestEdge,
  parseOutlineText,
  ringsToPolygon,
  type Rings,
} from "./outline-edit";
import { boundsOf, fitBounds, gridLines, niceStep, scaleBar, toScreen, toWorld, zoomAt } from "./plan-view";

const square: Rings = [
  [
    [0, 0],
    [10, 0],
    [10, 6],
    [0, 6],
  ],
];

describe("outline editing steps", () => {
  it("inserts, moves and deletes vertices, and the result validates with its area", () => {
    let r = insertVertex(square, 0, 0, [5, -1]);
    expect(r[0]).toEqual([
      [0, 0],
      [5, -1],
      [10, 0],
      [10, 6],
      [0, 6],
    ]);
    r = moveVertex(r, 0, 1, [5, 0]);
    const check = checkOutline(ringsToPolygon(r));
    expect(check.ok && check.window.area).toBe(60); // 10 m × 6 m, the inserted vertex lies on the edge
    r = deleteVertex(r, 0, 1);
    expect(r[0]).toHaveLength(4);
  });

  it("refuses to leave the edge with fewer than three vertices; a hole of three goes altogether", () => {
    const tri: Rings = [
      [
        [0, 0],
        [4, 0],
        [0, 4],
      ],
      [
        [1, 1],
        [2, 1],
        [1, 2],
      ],
    ];
    expect(() => deleteVertex(tri, 0, 0)).toThrow(/at least three/);
    expect(deleteVertex(tri, 1, 0)).toHaveLength(1);
  });

  it("finds the nearest edge point", () => {
    const hit = nearestEdge(square, 4, -0.5)!;
    expect(hit).toMatchObject({ ring: 0, edge: 0, point: [4, 0] });
    expect(hit.distance).toBeCloseTo(0.5, 12);
  });

  it("locates a self-crossing and a hole outside the edge", () => {
    const bow: Rings = [
      [
        [0, 0],
        [4, 4],
        [4, 0],
        [0, 4],
      ],
    ];
    expect(locateProblem(bow)).toEqual({ ring: 0, edges: [0, 2] });
    expect(checkOutline(ringsToPolygon(bow)).ok).toBe(false);
    const outside: Rings = [
      ...square,
      [
        [11, 1],
        [12, 1],
        [12, 2],
      ],
    ];
    expect(locateProblem(outside)).toMatchObject({ ring: 1, rings: [0, 1] });
    expect(
      locateProblem([
        ...square,
        [
          [4, 2],
          [6, 2],
          [6, 3],
          [4, 3],
        ],
      ]),
    ).toBeNull();
  });
});

describe("pasted coordinates", () => {
  it("reads CSV with a header and a blank line before a hole", () => {
    const rings = parseOutlineText("x,y\n0,0\n10,0\n10,6\n0,6\n0,0\n\n4,2\n6,2\n6,3\n4,3\n");
    expect(rings).toEqual([
      [
        [0, 0],
        [10, 0],
        [10, 6],
        [0, 6],
      ],
      [
        [4, 2],
        [6, 2],
        [6, 3],
        [4, 3],
      ],
    ]);
    const check = checkOutline(ringsToPolygon(rings));
    expect(check.ok && check.window.area).toBe(58); // 60 m² less the 2 m² baulk
  });

  it("reads CSV with a ring column, and semicolons", () => {
    expect(parseOutlineText("0;0;0\n3;0;0\n0;3;0\n1;1;1\n1.5;1;1\n1;1.5;1")).toHaveLength(2);
  });

  it("reads GeoJSON Feature and FeatureCollection", () => {
    const poly = {
      type: "Polygon",
      coordinates: [
        [
          [0, 0],
          [2, 0],
          [2, 2],
          [0, 0],
        ],
      ],
    };
    expect(parseOutlineText(JSON.stringify({ type: "Feature", geometry: poly, properties: {} }))).toEqual([
      [
        [0, 0],
        [2, 0],
        [2, 2],
      ],
    ]);
    expect(
      parseOutlineText(JSON.stringify({ type: "FeatureCollection", features: [{ type: "Feature", geometry: poly }] })),
    ).toHaveLength(1);
  });

  it("names the bad line or type", () => {
    expect(() => parseOutlineText("0,0\n1,x\n")).toThrow(/Line 2/);
    expect(() => parseOutlineText('{"type":"LineString","coordinates":[]}')).toThrow(/LineString is not a Polygon/);
    expect(() => parseOutlineText("{nope")).toThrow(/not valid JSON/);
  });
});

describe("plan view", () => {
  const v = { scale: 50, ox: 100, oy: 400 };
  it("maps grid to screen with north up and back", () => {
    expect(toScreen(v, 2, 3)).toEqual([200, 250]);
    expect(toWorld(v, 200, 250)).toEqual([2, 3]);
  });
  it("zooms about the pointer", () => {
    const z = zoomAt(v, 2, 200, 250);
    expect(toWorld(z, 200, 250)).toEqual([2, 3]);
    expect(z.scale).toBe(100);
  });
  it("bounds every point given, one point as itself, and an empty list as an empty box", () => {
    const spread = [...square[0]!, [12, -2] as [number, number], [4, 9] as [number, number]];
    expect(boundsOf(spread)).toEqual({ minX: 0, minY: -2, maxX: 12, maxY: 9 });
    expect(boundsOf([[-3.5, 2]])).toEqual({ minX: -3.5, minY: 2, maxX: -3.5, maxY: 2 });
    expect(boundsOf([])).toEqual({ minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity });
  });
  it("fits bounds into the viewport", () => {
    const f = fitBounds({ minX: 0, minY: 0, maxX: 10, maxY: 6 }, 1000, 600, 50);
    expect(f.scale).toBeCloseTo(500 / 6, 9);
    expect(toScreen(f, 5, 3)).toEqual([500, 300]);
  });
  it("picks 1-2-5 steps for grid lines and the scale bar", () => {
    expect(niceStep(0.3)).toBeCloseTo(0.5, 12);
    expect(niceStep(1)).toBe(1);
    expect(niceStep(1.2)).toBe(2);
    const g = gridLines(v, 400, 400, 70);
    expect(g.step).toBe(2);
    expect(g.xs[0]).toBe(-2);
    const bar = scaleBar(v, 120);
    expect([1, 2, 5].map((m) => m * 10 ** Math.round(Math.log10(bar.metres)))).toContain(bar.metres);
    expect(bar.px).toBeLessThanOrEqual(126);
  });
});
