/**
 * The demo trench used by the benchmark and the tests: an irregular L-shaped cut, about 12 m × 8 m on the
 * site grid, with a rectangular baulk left standing in the long arm. It is deliberately thin and concave,
 * the case where a bounding rectangle or a convex hull would be the wrong study area.
 */
import type { WindowInput } from "../types";

export const DEMO_TRENCH: WindowInput = {
  outer: [
    [0, 0],
    [12.1, 0.3],
    [11.8, 3.9],
    [5.2, 4.3],
    [5.0, 8.0],
    [0.2, 7.8],
  ],
  holes: [
    [
      [7.0, 1.5],
      [9.0, 1.5],
      [9.0, 2.3],
      [7.0, 2.3],
    ],
  ],
};
