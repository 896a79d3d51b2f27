import "server-only";

/**
 * The one row an `insert … returning()` or an `update … returning()` of a row just read wrote. Drizzle types
 * the answer as a list; an empty one here means the row vanished inside the transaction, which is a fault
 * to report, not a value to carry on with.
 */
export function written<T>(rows: readonly T[], what: string): T {
  const [row] = rows;
  if (row === undefined) throw new Error(`${what} was not written: the database returned no row.`);
  return row;
}
