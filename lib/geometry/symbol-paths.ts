import type { symbolShapes } from "@/lib/schemas/artefact-class";

export type SymbolShape = (typeof symbolShapes)[number];

/**
 * Each class symbol as an SVG path in a unit box centred on the origin (radius 1), so the plan, legends,
 * plots and the printed report draw the same shapes. Filled shapes are drawn with a dark outline so they
 * stay readable on a photo; "cross", "ring" and "bar" read by outline alone.
 */
export const symbolPath: Record<SymbolShape, string> = {
  disc: "M 1 0 A 1 1 0 1 1 -1 0 A 1 1 0 1 1 1 0 Z",
  square: "M -0.85 -0.85 H 0.85 V 0.85 H -0.85 Z",
  triangle: "M 0 -1 L 0.95 0.75 L -0.95 0.75 Z",
  diamond: "M 0 -1.05 L 1.05 0 L 0 1.05 L -1.05 0 Z",
  cross: "M -0.3 -1 H 0.3 V -0.3 H 1 V 0.3 H 0.3 V 1 H -0.3 V 0.3 H -1 V -0.3 H -0.3 Z",
  star: "M 0 -1 L 0.24 -0.33 L 0.95 -0.31 L 0.38 0.12 L 0.59 0.81 L 0 0.4 L -0.59 0.81 L -0.38 0.12 L -0.95 -0.31 L -0.24 -0.33 Z",
  ring: "M 1 0 A 1 1 0 1 1 -1 0 A 1 1 0 1 1 1 0 Z M 0.5 0 A 0.5 0.5 0 1 0 -0.5 0 A 0.5 0.5 0 1 0 0.5 0 Z",
  bar: "M -1 -0.35 H 1 V 0.35 H -1 Z",
};
