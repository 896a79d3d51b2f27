import { z } from "zod";
import "@/lib/schemas/messages";
import { testSpecSchema, type TestSpec } from "@/lib/spatial/run/run-spec";
import { neighbourRuleSchema, squareTestSpecSchema } from "@/lib/spatial/lattice/square-test-spec";
import { formerSquareTestSchema, formerTestSchema } from "./former-run";

/**
 * What a specialist asks for when starting a run: the scope (one trench, the contexts that form one surface,
 * the classes), the tests, and the shared parameters. Pure schemas, shared by the API catalogue, the
 * workspace form (which builds the same shape) and the route handler (which parses it). Every object is
 * strict: a misspelt option ("corection") is refused with the key named rather than dropped and replaced
 * by its default. Stored runs are not parsed with these schemas; they are read as they were stored.
 */
const id = z.string().uuid("Not a valid record id.");

export const correctionSchema = z.enum(["isotropic", "translation", "border"]);
export type Correction = z.infer<typeof correctionSchema>;

const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * One test of a run: the engine's own test description (lib/spatial/run/run-spec.ts), stored as asked and
 * run as stored. In Loamwork every class a test names (`class`, `a`, `b`, `reference`) is the class's record
 * id, and a test on one class names it; the engine is handed the site's class codes in their place.
 */
export const testSchema = testSpecSchema.superRefine((t, ctx) => {
  const fields: [string, string | undefined][] =
    t.type === "cross-l" || t.type === "k-difference"
      ? [
          ["a", t.a],
          ["b", t.b],
        ]
      : [
          ["class", t.class],
          ...(t.type === "inhomogeneous-l" ? ([["reference", t.reference]] as [string, string | undefined][]) : []),
        ];
  for (const [field, value] of fields) {
    if (value === undefined) {
      if (field === "class")
        ctx.addIssue({ code: "custom", path: [field], message: "Name the class this test runs on." });
    } else if (!uuid.test(value)) ctx.addIssue({ code: "custom", path: [field], message: "Not a valid record id." });
  }
});
export type RunTest = TestSpec;
export type RunTestInput = z.input<typeof testSchema>;
export type TestKind = RunTest["type"];

const [contiguity, distanceBand] = neighbourRuleSchema.options;

/**
 * A test on counts by grid square, run on each class in scope: the engine's own spec
 * (lib/spatial/lattice/square-test-spec.ts) less the run's permutations, seed and level, which serve every
 * test. Its counts are summed over the chosen contexts and their spits, per square of the trench's grid.
 * Loamwork's defaults where the engine's differ: rook and queen between the squares as the outline and
 * holes cut them ("shapes"), a distance band up to 1.5 squares of the trench's grid when no upper limit is
 * given, and a square left with no neighbours dropped rather than refusing the test.
 */
export const squareTestSchema = squareTestSpecSchema.omit({ permutations: true, seed: true, level: true }).extend({
  neighbours: z
    .discriminatedUnion("type", [
      contiguity.extend({ from: z.enum(["grid", "shapes"]).default("shapes") }),
      distanceBand.extend({
        upper: z.coerce.number().positive("The distance band must be longer than 0 m.").max(1000).optional(),
      }),
    ])
    .default({ type: "queen", from: "shapes" })
    .refine((n) => n.type !== "distance" || n.upper === undefined || n.lower < n.upper, {
      message: "The distance band's lower limit must be below its upper limit.",
      path: ["lower"],
    }),
  minArea: z.coerce.number().min(0).max(100).default(0),
  isolated: z.enum(["refuse", "drop"]).default("drop"),
});
export type SquareTest = z.output<typeof squareTestSchema>;
export type SquareTestInput = z.input<typeof squareTestSchema>;
export type SquareTestKind = SquareTest["type"];

export const runParamsSchema = z.strictObject({
  /** The edge correction of tests asked for in the former shape (former-run.ts); the engine's tests carry their own. */
  correction: correctionSchema.optional(),
  /** Largest distance studied (m); default a quarter of the trench's short side. */
  rmax: z.coerce.number().positive("The distance range must be larger than 0 m.").optional(),
  nsim: z.coerce.number().int().min(19, "Use at least 19 simulations (p can then reach 0.05).").max(9999).default(999),
  level: z.coerce.number().gt(0).lt(0.5).default(0.05),
  seed: z.coerce
    .number()
    .int()
    .min(0)
    .max(2 ** 31 - 1)
    .optional(),
});
export type RunParamsInput = z.input<typeof runParamsSchema>;

/** A reduced level bounding the scope (m above the site datum); blank or absent = no bound on that side. */
const boundLevel = z.preprocess(
  (v) => (typeof v === "string" ? (v.trim() === "" ? undefined : Number(v.trim())) : v === null ? undefined : v),
  z
    .number({ error: "Enter a reduced level in metres, e.g. 41.25." })
    .refine(Number.isFinite, "Enter a reduced level in metres, e.g. 41.25.")
    .refine((v) => Math.abs(v) < 10000, "A reduced level lies within 10 km of the datum.")
    .optional(),
);

/** Lowest bound at or below the highest: a reversed range would silently hold no finds. */
const levelOrder = {
  check: (s: { levelFrom?: number; levelTo?: number }) =>
    s.levelFrom === undefined || s.levelTo === undefined || s.levelFrom <= s.levelTo,
  message: "The lower level (from) must not be higher than the upper level (to).",
};

/**
 * The scope may be limited by depth: to finds whose reduced level lies in [levelFrom, levelTo] (inclusive,
 * metres above the site datum; finds with no level are then left out and named), and/or to finds recorded
 * in the chosen spits of the chosen contexts. Both absent = every find of the contexts, as before.
 */
export const runScopeSchema = z
  .strictObject({
    trenchId: id,
    contextIds: z.array(id).min(1, "Choose at least one context.").max(50),
    classIds: z.array(id).min(1, "Choose at least one class.").max(12),
    levelFrom: boundLevel,
    levelTo: boundLevel,
    spitIds: z.array(id).max(200).optional(),
  })
  .refine(levelOrder.check, { message: levelOrder.message, path: ["levelFrom"] });
export type RunScope = z.infer<typeof runScopeSchema>;

export const runCreateSchema = z
  .strictObject({
    scope: runScopeSchema,
    /** Tests in the engine's shape, or in the shape Loamwork asked for before (read by former-run.ts). */
    tests: z.array(z.union([testSchema, formerTestSchema])).max(200),
    /**
     * Tests on counts by grid square, in the engine's shape or the one Loamwork asked for before (read by
     * former-run.ts); a run may hold them beside point tests, or alone.
     */
    squareTests: z
      .array(z.union([squareTestSchema, formerSquareTestSchema]))
      .max(20)
      .default([]),
    params: runParamsSchema.default({ nsim: 999, level: 0.05 }),
    label: z.string().trim().max(120).optional(),
  })
  .refine((r) => r.tests.length + r.squareTests.length > 0, { message: "Choose at least one test.", path: ["tests"] });
export type RunCreate = z.infer<typeof runCreateSchema>;
export type RunCreateInput = z.input<typeof runCreateSchema>;

/** Query of the scope summary: ids joined by commas so a URL can carry them. */
const idList = z
  .string()
  .default("")
  .transform((s) =>
    s
      .split(",")
      .map((v) => v.trim())
      .filter(Boolean),
  )
  .pipe(z.array(id));
export const scopeQuerySchema = z
  .object({
    trenchId: id,
    contextIds: idList,
    classIds: idList,
    levelFrom: boundLevel,
    levelTo: boundLevel,
    spitIds: idList,
  })
  .refine(levelOrder.check, { message: levelOrder.message, path: ["levelFrom"] });

export const runListQuerySchema = z.object({ trenchId: id.optional() });
