import type { z } from "zod";

/** The search parameters a page is given from its URL. */
export type UrlSearch = Record<string, string | undefined>;

/** What a plain GET form sent, without the fields left blank (a blank filter sets no filter). */
export function filledIn(search: UrlSearch): Record<string, string> {
  return Object.fromEntries(Object.entries(search).filter((e): e is [string, string] => !!e[1]));
}

/**
 * A page's query from its URL, read by the same schema the API reads it with; where it does not parse, the
 * schema's defaults, and `valid` false so that the page can say so.
 */
export function readUrlQuery<S extends z.ZodType>(schema: S, search: UrlSearch): { q: z.output<S>; valid: boolean } {
  const parsed = schema.safeParse(filledIn(search));
  return parsed.success ? { q: parsed.data, valid: true } : { q: schema.parse({}), valid: false };
}
