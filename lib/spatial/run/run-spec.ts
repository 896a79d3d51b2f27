/**
 * The JSON input of a distribution-test run (the command line and the TypeScript entry take the same
 * object), checked with zod. Defaults: seed 1, 999 simulations, level 0.05, the spatstat r grid, two worker
 * threads. Documented with an example in docs/spatial-cli.md.
 */
import { z } from "zod";
import { SpatialInputError } from "../errors";

const vertex = z.tuple([z.number(), z.number()]);
const ring = z.array(vertex);
const cls = z.union([z.string(), z.number()]).transform(String);
const statistic = z.enum(["mad", "dclf", "rank"]).default("mad");
const correction = z.enum(["isotropic", "translation", "border"]).default("isotropic");
const pairCorrection = z.enum(["isotropic", "translation"]).default("isotropic");

/**
 * The same shape twice: strict for new input (an unknown key, e.g. a misspelt "corection", is refused with
 * its name, instead of being dropped and the default used), and lenient for a run description read back
 * from storage, which is taken as it was stored. `z.object` strips unknown keys where `z.strictObject`
 * refuses them; both give the same output type.
 */
function makeRunSpecSchema(object: typeof z.strictObject) {
  const test = z.discriminatedUnion("type", [
    object({
      type: z.literal("clark-evans"),
      class: cls.optional(),
      correction: z.enum(["none", "donnelly", "monte-carlo"]).default("none"),
      alternative: z.enum(["two-sided", "clustered", "regular"]).default("two-sided"),
    }),
    object({
      type: z.literal("quadrat"),
      class: cls.optional(),
      nx: z.number().int().min(1).max(50).default(4),
      ny: z.number().int().min(1).max(50).default(4),
      /** A cell size (m) instead of nx × ny: as many equal cells across the bounding box as fit (quadratGrid). */
      cellSize: z.number().positive().max(100).optional(),
      alternative: z.enum(["two-sided", "clustered", "regular"]).default("two-sided"),
    }),
    object({
      type: z.literal("l-envelope"),
      class: cls.optional(),
      count: z.enum(["fixed", "poisson"]).default("poisson"),
      correction,
      statistic,
    }),
    object({
      type: z.literal("pcf-envelope"),
      class: cls.optional(),
      count: z.enum(["fixed", "poisson"]).default("poisson"),
      statistic,
    }),
    object({
      type: z.literal("cross-l"),
      a: cls,
      b: cls,
      null: z.enum(["random-labelling", "a-fixed"]).default("random-labelling"),
      count: z.enum(["fixed", "poisson"]).default("fixed"),
      correction: pairCorrection,
      statistic,
      /**
       * The summary function the envelope test runs on: cross-L (default) or cross-K, as spatstat's envelope of Kcross.
       */
      fun: z.enum(["L", "K"]).default("L"),
    }),
    object({ type: z.literal("k-difference"), a: cls, b: cls, correction: pairCorrection, statistic }),
    object({
      type: z.literal("inhomogeneous-l"),
      class: cls,
      reference: cls.optional(),
      bandwidth: z.number().positive().optional(),
      statistic,
    }),
  ]);

  const run = object({
    window: object({ outer: ring, holes: z.array(ring).optional() }),
    points: z.array(object({ x: z.number(), y: z.number(), cls: cls.optional() })),
    seed: z.number().int().min(0).max(0xffffffff).default(1),
    nsim: z.number().int().min(19).max(99_999).default(999),
    level: z.number().gt(0).lt(0.5).default(0.05),
    r: z
      .union([
        z.array(z.number()),
        object({ max: z.number().positive().optional(), count: z.number().int().min(2).max(4097).optional() }),
      ])
      .optional(),
    workers: z.number().int().min(0).max(16).optional(),
    tests: z.array(test).min(1),
  });
  return { run, test };
}

const strict = makeRunSpecSchema(z.strictObject);
export const runSpecSchema = strict.run;
/** One test of a run, strict: the shape an application stores for each test it asks the engine to run. */
export const testSpecSchema = strict.test;
const storedRunSpecSchema = makeRunSpecSchema(z.object as unknown as typeof z.strictObject).run;

export type RunSpecInput = z.input<typeof runSpecSchema>;
export type RunSpec = z.output<typeof runSpecSchema>;
export type TestSpec = RunSpec["tests"][number];
export type TestSpecInput = RunSpecInput["tests"][number];

export interface ParseRunSpecOptions {
  /** A description read back from storage: unknown keys are dropped instead of refused. */
  stored?: boolean;
}

/** Parse and default a run spec; every problem is reported with its place in the input. */
export function parseRunSpec(input: unknown, options: ParseRunSpecOptions = {}): RunSpec {
  const parsed = (options.stored ? storedRunSpecSchema : runSpecSchema).safeParse(input);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.length ? i.path.join(".") : "input"}: ${i.message}`);
    throw new SpatialInputError(`The run description is not valid — ${problems.slice(0, 5).join("; ")}.`);
  }
  return parsed.data;
}
