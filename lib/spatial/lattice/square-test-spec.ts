/**
 * One square-count test as JSON (the Patterns run and the command line take the same object), checked
 * with zod. Defaults: queen contiguity on the grid, row-standardised weights, density per excavated m²,
 * 999 permutations, seed 1, level 0.05, two-sided.
 */
import { z } from "zod";
import { SpatialInputError } from "../errors";

/** Who neighbours whom (types.ts NeighbourRule): contiguity on the grid or the clipped shapes, or a distance band. */
export const neighbourRuleSchema = z.discriminatedUnion("type", [
  z.strictObject({ type: z.enum(["rook", "queen"]), from: z.enum(["grid", "shapes"]).default("grid") }),
  z.strictObject({
    type: z.literal("distance"),
    upper: z.number().positive().max(1000),
    lower: z.number().min(0).default(0),
  }),
]);

export const squareTestSpecSchema = z.strictObject({
  type: z.enum(["moran", "geary", "local-moran", "getis-ord"]),
  neighbours: neighbourRuleSchema.default({ type: "queen", from: "grid" }),
  style: z.enum(["binary", "row"]).default("row"),
  variable: z.enum(["density", "count"]).default("density"),
  /** Squares with less excavated area (m²) are left out. */
  minArea: z.number().min(0).max(100).default(0),
  isolated: z.enum(["refuse", "drop"]).default("refuse"),
  alternative: z.enum(["positive", "negative", "two-sided"]).default("two-sided"),
  permutations: z.number().int().min(0).max(99_999).default(999),
  seed: z.number().int().min(0).max(0xffffffff).default(1),
  level: z.number().gt(0).lt(0.5).default(0.05),
});

export type SquareTestSpecInput = z.input<typeof squareTestSpecSchema>;
export type SquareTestSpec = z.output<typeof squareTestSpecSchema>;

export function parseSquareTestSpec(input: unknown): SquareTestSpec {
  const parsed = squareTestSpecSchema.safeParse(input);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.length ? i.path.join(".") : "input"}: ${i.message}`);
    throw new SpatialInputError(`The square-count test is not valid — ${problems.slice(0, 5).join("; ")}.`);
  }
  if (parsed.data.neighbours.type === "distance" && parsed.data.neighbours.lower >= parsed.data.neighbours.upper) {
    throw new SpatialInputError("neighbours.lower: the distance band's lower limit must be below its upper limit.");
  }
  return parsed.data;
}
