import { z } from "zod";
import "./messages";
import { REDUCED_LEVEL_WORDS, metres, numeric, uuid } from "./common";

/**
 * Heights: every z, top, base and benchmark level in Loamwork is a reduced level (RL) in metres against the
 * site's datum. No update schema here carries a default: a field not sent is left as it is.
 */
export const reducedLevel = metres.describe(REDUCED_LEVEL_WORDS);

const code = z.string().trim().min(1, "Give the benchmark a code, e.g. TBM 2.").max(40);
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Give the date as YYYY-MM-DD.");

export const datumUpdateSchema = z
  .object({
    datumKind: z.enum(["national", "local"], { error: "Choose a national datum or a local site datum." }),
    datumName: z.string().trim().min(1, "Name the datum heights are measured from.").max(200),
    levelTolerance: numeric(
      z
        .number({ error: "Give the closing tolerance in metres." })
        .min(0, "The closing tolerance cannot be negative.")
        .max(0.5, "A closing tolerance over 0.5 m would hide blunders; common practice is a few millimetres."),
    ),
  })
  .partial()
  .strict();

export const benchmarkCreateSchema = z
  .object({
    code,
    description: z.string().trim().max(500),
    x: metres,
    y: metres,
    level: reducedLevel,
  })
  .strict();
export const benchmarkUpdateSchema = benchmarkCreateSchema.partial().strict();

export const levelTargets = [
  "benchmark",
  "change_point",
  "find",
  "context_top",
  "context_base",
  "spit_top",
  "spit_base",
  "ground",
  "other",
] as const;

const reading = numeric(
  z
    .number({ error: "A staff reading is a number of metres." })
    .min(0, "A staff reading cannot be negative.")
    .max(10, "A staff reading is at most 10 m."),
)
  .nullable()
  .optional()
  .transform((v) => v ?? null);

export const levelLineSchema = z
  .object({
    station: z.string().trim().min(1, "Say what the staff stood on.").max(120),
    target: z.enum(levelTargets),
    targetId: uuid
      .nullable()
      .optional()
      .transform((v) => v ?? null),
    backsight: reading,
    intermediate: reading,
    foresight: reading,
  })
  .strict();

export const levelRunCreateSchema = z
  .object({
    takenOn: isoDate,
    trenchId: uuid.nullable().optional(),
    startBenchmarkId: uuid,
    closingBenchmarkId: uuid.nullable().optional(),
    lines: z
      .array(levelLineSchema)
      .min(2, "A run needs a backsight and at least one more reading.")
      .max(500, "A run holds at most 500 lines; start another."),
  })
  .strict();

export const spitCreateSchema = z
  .object({
    number: numeric(
      z
        .number({ error: "Enter a spit number." })
        .int("A spit number is a whole number.")
        .min(1, "Spits are numbered from 1 at the top.")
        .max(999),
    ),
    topLevel: reducedLevel.nullable().optional(),
    baseLevel: reducedLevel.nullable().optional(),
  })
  .strict();
export const spitUpdateSchema = spitCreateSchema.partial().strict();

export type DatumUpdate = z.infer<typeof datumUpdateSchema>;
export type BenchmarkCreate = z.infer<typeof benchmarkCreateSchema>;
export type BenchmarkUpdate = z.infer<typeof benchmarkUpdateSchema>;
export type LevelRunCreate = z.infer<typeof levelRunCreateSchema>;
export type SpitCreate = z.infer<typeof spitCreateSchema>;
export type SpitUpdate = z.infer<typeof spitUpdateSchema>;
