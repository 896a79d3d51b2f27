import { z } from "zod";
import "@/lib/schemas/messages";

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

export const testSchema = z.discriminatedUnion("kind", [
  z.strictObject({
    kind: z.literal("clark-evans"),
    /** none: Clark & Evans 1954 as published; donnelly: Donnelly 1978 (rectangles, approximate); monte-carlo: exact in W. */
    correction: z.enum(["none", "donnelly", "monte-carlo"]).default("monte-carlo"),
    alternative: z.enum(["two-sided", "clustered", "regular"]).default("two-sided"),
  }),
  z.strictObject({
    kind: z.literal("quadrat"),
    cellSize: z.coerce.number().positive("A cell must be larger than 0 m.").max(100).default(1),
  }),
  z.strictObject({
    kind: z.literal("l-envelope"),
    /** MAD by default, as the engine and spatstat's `mad.test`; DCLF integrates over r and is often more powerful. */
    statistic: z.enum(["mad", "dclf"]).default("mad"),
    /** fixed: the observed n in every simulation; poisson: a Poisson number with mean n (spatstat's default). */
    count: z.enum(["fixed", "poisson"]).default("fixed"),
  }),
  z.strictObject({ kind: z.literal("pcf-envelope") }),
  z.strictObject({
    kind: z.literal("cross-l"),
    a: id,
    b: id,
    /** random-labelling: do A and B share locations more than labels shuffled among them? a-fixed: are B nearer A than CSR points? */
    null: z.enum(["random-labelling", "a-fixed"]).default("random-labelling"),
    /**
     * The function the envelope test runs on: Besag's cross-L (absent or "L") or Ripley's cross-K, as
     * spatstat's envelope of Kcross. No default written in, so runs asked for before it existed read the same.
     */
    fun: z.enum(["L", "K"]).optional(),
  }),
  z.strictObject({ kind: z.literal("k-difference"), a: id, b: id }),
  z.strictObject({
    kind: z.literal("inhomogeneous-l"),
    classId: id,
    reference: z.union([z.literal("all"), id]).default("all"),
  }),
]);
export type RunTest = z.infer<typeof testSchema>;
export type TestKind = RunTest["kind"];

/**
 * A test on counts by grid square (lib/spatial/lattice), run on each class in scope: its counts summed
 * over the chosen contexts and their spits, per square of the trench's grid. Neighbours are rook or queen
 * between the squares as the outline and holes cut them, or a distance band between the cut squares'
 * centroids; the permutations, seed and level are the run's.
 */
export const squareTestSchema = z.strictObject({
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
export type SquareTest = z.infer<typeof squareTestSchema>;
export type SquareTestKind = SquareTest["kind"];

export const runParamsSchema = z.strictObject({
  correction: correctionSchema.default("isotropic"),
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
    tests: z.array(testSchema).max(40),
    /** Tests on counts by grid square; a run may hold them beside point tests, or alone. */
    squareTests: z.array(squareTestSchema).max(20).default([]),
    params: runParamsSchema.default({ correction: "isotropic", nsim: 999, level: 0.05 }),
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
