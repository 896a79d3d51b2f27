import { describe, expect, it } from "vitest";
import { createWindow } from "./window";
import { isotropicWeight } from "./edge-isotropic";
import { translationWeight } from "./edge-translation";

// L-shaped trench [0,10]×[0,4] ∪ [0,4]×[4,10] with the hole [6,8]×[1,2].
const trench = createWindow({
  outer: [
    [0, 0],
    [10, 0],
    [10, 4],
    [4, 4],
    [4, 10],
    [0, 10],
  ],
  holes: [
    [
      [6, 1],
      [6, 2],
      [8, 2],
      [8, 1],
    ],
  ],
});

describe("edge weights against spatstat", () => {
  it("isotropic weights equal spatstat's edge.Ripley", () => {
    // Expected: spatstat 3.0.3 (spatstat.explore 3.0.6, R 4.2.2), edge.Ripley(ppp(c(3.5, 5.5, 0.3, 7),
    // c(3.5, 2.5, 9.6, 0.4), window = W), matrix(c(1.2, 2, 0.5, 1.9), ncol = 1)), run by hand.
    const cases: [number, number, number, number][] = [
      [3.5, 3.5, 1.2, 1.12764772848009], // near the notch corner (4, 4)
      [5.5, 2.5, 2.0, 1.48106769629861], // reaching the hole and the notch edge
      [0.3, 9.6, 0.5, 2.0], // corner: 3-4-5 geometry, the two cut arcs meet
      [7, 0.4, 1.9, 1.76205938198469], // between the bottom edge and the hole
    ];
    for (const [x, y, r, w] of cases) expect(isotropicWeight(trench, x, y, r)).toBeCloseTo(w, 12);
  });

  it("translation weights equal spatstat's exact edge.Trans", () => {
    // Expected: spatstat 3.0.3 (spatstat.geom 3.0.6), edge.Trans(dx = c(1.5, -2, 3), dy = c(0.5, 3, -1),
    // W = W, paired = TRUE, exact = TRUE), run by hand.
    const cases: [number, number, number][] = [
      [1.5, 0.5, 1.51219512195122],
      [-2, 3, 2.38461538461538],
      [3, -1, 2.2962962962963],
    ];
    for (const [dx, dy, w] of cases) expect(translationWeight(trench, dx, dy)).toBeCloseTo(w, 12);
  });
});
