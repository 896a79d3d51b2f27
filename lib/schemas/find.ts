import { z } from "zod";
import "./messages";
import { REDUCED_LEVEL_WORDS, metres, numeric, pageQuery, uuid } from "./common";

const optionalNumber = <T extends z.ZodTypeAny>(inner: T) =>
  z.preprocess((v) => (v === "" || v === undefined ? null : v), inner.nullable()).optional();

/**
 * The highest find number Loamwork hands out or accepts: 99,999,999, eight digits, far beyond any
 * excavation's finds (a busy site records a few hundred thousand) and well inside the database's 32-bit
 * integer, so allocation can never overflow. Imported numbers above it are refused row by row; a site whose
 * numbers are used up is told so instead of receiving a number.
 */
export const MAX_FIND_NUMBER = 99_999_999;

/** A find number as a file or a form gives it: a whole number from 1 to MAX_FIND_NUMBER. */
export const findNumberSchema = numeric(
  z
    .number({ error: "A find number is a whole number." })
    .int("A find number is a whole number.")
    .min(1, "Find numbers start at 1.")
    .max(MAX_FIND_NUMBER, `Find numbers go up to ${MAX_FIND_NUMBER.toLocaleString("en-GB")}.`),
);

/** A record picked from a list: an empty choice is named before the id's form is checked. */
const picked = (message: string) => z.string().min(1, message).pipe(uuid);

/** The fields a find's sheet holds, without defaults: an update names only what it changes. */
const findFields = {
  contextId: picked("Pick the context it came from."),
  classId: picked("Pick the find's class."),
  x: metres,
  y: metres,
  z: optionalNumber(metres).describe(REDUCED_LEVEL_WORDS),
  count: optionalNumber(
    numeric(
      z
        .number({ error: "Enter a count." })
        .int("A count is a whole number.")
        .min(1, "A count is at least 1.")
        .max(1_000_000, "A count is at most 1,000,000."),
    ),
  ),
  weightG: optionalNumber(
    numeric(
      z
        .number({ error: "Enter a weight in grams." })
        .min(0, "A weight cannot be negative.")
        .max(10_000_000, "A weight is at most 10,000,000 g."),
    ),
  ),
  description: z.string().trim().max(4000, "A description is at most 4,000 characters."),
};

/**
 * A find's rules, written once: the API's create and update schemas, the plan's quick form and the import's
 * row check all derive from these fields.
 */
export const findRules = z.object(findFields);

/** The plan's quick form: the tap gives x and y, the form the rest (strings as typed; blank = none). */
export const findFormSchema = findRules.pick({
  classId: true,
  contextId: true,
  z: true,
  count: true,
  weightG: true,
  description: true,
});

export const findCreateSchema = z.object({
  ...findFields,
  /** Only for a find recorded from a block of numbers the sender holds (offline); otherwise the server numbers it. */
  number: findNumberSchema.optional(),
  description: findFields.description.default(""),
  method: z.enum(["plan", "typed", "imported"]).default("typed"),
});

/** No defaults here: a field left out stays as it is. */
export const findUpdateSchema = z.object(findFields).partial();

export const findSortKeys = ["number", "recordedAt", "trench", "context", "class", "recorder", "x", "y", "z"] as const;

export const findListQuery = pageQuery.extend({
  trenchId: uuid.optional(),
  contextId: uuid.optional(),
  classId: uuid.optional(),
  recordedBy: uuid.optional(),
  from: z.coerce.date().optional(),
  to: z.coerce.date().optional(),
  q: z.string().trim().max(200).optional(),
  sort: z.enum(findSortKeys).default("number"),
  dir: z.enum(["asc", "desc"]).default("asc"),
});

export type FindCreate = z.infer<typeof findCreateSchema>;
export type FindUpdate = z.infer<typeof findUpdateSchema>;
export type FindListQuery = z.infer<typeof findListQuery>;
