import { z } from "zod";

export const uuid = z.string().uuid("Not a valid record id.");
export const roles = ["digger", "specialist", "director"] as const;
export const roleSchema = z.enum(roles);

/** A finite number of site-grid metres; strings from forms and CSV are accepted when numeric. */
export const metres = z.coerce
  .number({ error: "Enter a number of metres." })
  .refine(Number.isFinite, "Enter a finite number of metres.")
  .refine((v) => Math.abs(v) < 1e7, "That coordinate is implausibly far from the site grid origin.");

/** Paging for every list: 1-based page, at most 500 rows a page. */
export const pageQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(50),
});

export const emptyQuery = z.object({}).passthrough();
