import { z } from "zod";
import "./messages";

export const uuid = z.string().uuid("Not a valid record id.");

/** Any 8-4-4-4-12 hex id, as the database's uuid type reads it; anything else names no record. */
export const isUuid = (value: string) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(value);
export const roles = ["digger", "specialist", "director"] as const;
export const roleSchema = z.enum(roles);

/** A decimal as a form field holds it: an optional sign, digits, an optional fraction. No exponent, hex or blank. */
const plainDecimal = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/;

/**
 * A number as JSON sends it, or a plain decimal string (forms post text); nothing else is read as a number.
 * `z.coerce.number()` read `true` as 1, `[3]` as 3, `"0x3"` as 3 and `null` or `""` as 0: those are refused.
 */
export function numeric<T extends z.ZodType<number>>(inner: T) {
  return z.preprocess((v) => (typeof v === "string" && plainDecimal.test(v.trim()) ? Number(v.trim()) : v), inner);
}

/** A finite number of site-grid metres (a plain decimal string from a form is read as one). */
export const metres = numeric(
  z
    .number({ error: "Enter a number of metres." })
    .refine(Number.isFinite, "Enter a finite number of metres.")
    .refine((v) => Math.abs(v) < 1e7, "That coordinate is implausibly far from the site grid origin."),
);

/** Paging for every list: 1-based page, at most 500 rows a page. */
export const pageQuery = z.object({
  page: numeric(z.number().int().min(1)).default(1),
  pageSize: numeric(z.number().int().min(1).max(500)).default(50),
});

export const emptyQuery = z.object({}).passthrough();

/** What every z, top, base and benchmark level in Loamwork is (README: "What z is"). */
export const REDUCED_LEVEL_WORDS = "Reduced level (RL), metres against the site's datum";
