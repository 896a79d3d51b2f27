import { z } from "zod";
import "@/lib/schemas/messages";
import type { TestSpec } from "@/lib/spatial/run/run-spec";
import type { SquareTest } from "./run";

/**
 * The one reader of runs in the shape Loamwork used before it took the engine's test descriptions: a test
 * named by `kind`, run on every class in scope, with the run's edge correction kept beside the tests. Runs
 * stored that way (and requests scripts still send that way) are turned into the engine's tests exactly as
 * the former translation did, class by class in the order the run read its classes, so a stored run opens
 * with today's shape and, started again, reproduces its result (the seed's streams follow the test order).
 */
const id = z.string().uuid("Not a valid record id.");

export const formerTestSchema = z.discriminatedUnion("kind", [
  z.strictObject({
    kind: z.literal("clark-evans"),
    correction: z.enum(["none", "donnelly", "monte-carlo"]).default("monte-carlo"),
    alternative: z.enum(["two-sided", "clustered", "regular"]).default("two-sided"),
  }),
  z.strictObject({
    kind: z.literal("quadrat"),
    cellSize: z.coerce.number().positive("A cell must be larger than 0 m.").max(100).default(1),
  }),
  z.strictObject({
    kind: z.literal("l-envelope"),
    statistic: z.enum(["mad", "dclf"]).default("mad"),
    count: z.enum(["fixed", "poisson"]).default("fixed"),
  }),
  z.strictObject({ kind: z.literal("pcf-envelope") }),
  z.strictObject({
    kind: z.literal("cross-l"),
    a: id,
    b: id,
    null: z.enum(["random-labelling", "a-fixed"]).default("random-labelling"),
    fun: z.enum(["L", "K"]).optional(),
  }),
  z.strictObject({ kind: z.literal("k-difference"), a: id, b: id }),
  z.strictObject({
    kind: z.literal("inhomogeneous-l"),
    classId: id,
    reference: z.union([z.literal("all"), id]).default("all"),
  }),
]);
export type FormerTest = z.output<typeof formerTestSchema>;

/** A test on counts by grid square as Loamwork asked for it before it took the engine's spec. */
export const formerSquareTestSchema = z.strictObject({
  kind: z.enum(["moran", "geary", "local-moran", "getis-ord"]),
  neighbours: z.enum(["queen", "rook", "distance"]).default("queen"),
  /** The distance band's upper limit (m), for neighbours "distance"; default 1.5 squares. */
  band: z.coerce.number().positive("The distance band must be longer than 0 m.").max(1000).optional(),
  style: z.enum(["row", "binary"]).default("row"),
  /** density: count per excavated m² (the default); count: the raw count. */
  variable: z.enum(["density", "count"]).default("density"),
  /** Squares with less excavated area (m²) are left out. */
  minArea: z.coerce.number().min(0).max(100).default(0),
});
export type FormerSquareTest = z.output<typeof formerSquareTestSchema>;

export const isFormerTest = (t: unknown): t is FormerTest =>
  typeof t === "object" && t !== null && "kind" in t && !("type" in t);

type Correction = "isotropic" | "translation" | "border";

/**
 * Former tests as the engine's, with class ids. `classOrder`: the classes in the order the run read them
 * (by code); `correction`: the run's edge correction (the between-class tests offer isotropic and
 * translation only, so border falls back to isotropic, as it always did).
 */
function fromFormerTests(tests: FormerTest[], classOrder: string[], correction: Correction): TestSpec[] {
  const pair = correction === "translation" ? "translation" : "isotropic";
  return tests.flatMap((t): TestSpec[] => {
    switch (t.kind) {
      case "clark-evans":
        return classOrder.map((c) => ({
          type: "clark-evans",
          class: c,
          correction: t.correction,
          alternative: t.alternative,
        }));
      case "quadrat":
        return classOrder.map((c) => ({
          type: "quadrat",
          class: c,
          nx: 4,
          ny: 4,
          cellSize: t.cellSize,
          alternative: "two-sided",
        }));
      case "l-envelope":
        return classOrder.map((c) => ({
          type: "l-envelope",
          class: c,
          count: t.count,
          correction,
          statistic: t.statistic,
        }));
      case "pcf-envelope":
        return classOrder.map((c) => ({ type: "pcf-envelope", class: c, count: "fixed", statistic: "dclf" }));
      case "cross-l":
        return [
          {
            type: "cross-l",
            a: t.a,
            b: t.b,
            null: t.null,
            count: "fixed",
            correction: pair,
            statistic: "dclf",
            fun: t.fun ?? "L",
          },
        ];
      case "k-difference":
        return [{ type: "k-difference", a: t.a, b: t.b, correction: pair, statistic: "dclf" }];
      case "inhomogeneous-l":
        return [
          {
            type: "inhomogeneous-l",
            class: t.classId,
            reference: t.reference === "all" ? undefined : t.reference,
            statistic: "dclf",
          },
        ];
    }
  });
}

/**
 * A run's tests in the engine's shape, whichever shape they were asked or stored in. Stored former tests
 * went through the former schema's defaults when they were asked for; they are read leniently here.
 */
export function readRunTests(
  tests: readonly unknown[],
  classOrder: string[],
  correction: Correction | undefined,
): TestSpec[] {
  return tests.flatMap((t) =>
    isFormerTest(t)
      ? fromFormerTests([formerTestSchema.parse(t)], classOrder, correction ?? "isotropic")
      : [t as TestSpec],
  );
}

/**
 * A run's square-count tests in the engine's shape (less the run's permutations, seed and level), whichever
 * shape they were asked or stored in. A former test is what the former code handed the engine: rook and
 * queen from the squares as the outline cuts them, its band (or, unset, 1.5 squares when it runs), isolated
 * squares dropped, two-sided.
 */
export function readSquareTests(tests: readonly unknown[]): SquareTest[] {
  return tests.map((t): SquareTest => {
    if (!(typeof t === "object" && t !== null && "kind" in t && !("type" in t))) return t as SquareTest;
    const f = formerSquareTestSchema.parse(t);
    return {
      type: f.kind,
      neighbours:
        f.neighbours === "distance"
          ? { type: "distance", lower: 0, ...(f.band !== undefined && { upper: f.band }) }
          : { type: f.neighbours, from: "shapes" },
      style: f.style,
      variable: f.variable,
      minArea: f.minArea,
      isolated: "drop",
      alternative: "two-sided",
    };
  });
}
