import "server-only";
import { sql, type AnyColumn } from "drizzle-orm";
import { PublicError, conflict } from "./errors";

/**
 * Record versions: finds, contexts and trenches carry an integer `version`, raised by every change. A write
 * made on a version the device read sends it as `If-Match: "<version>"` (RFC 9110 §13.1.1, the version as
 * the entity tag); when the record has moved on, the write is refused with 409 `stale` and the record as it
 * is now in `details.current`, never applied over the newer one. A write without If-Match (or `If-Match: *`)
 * is not checked, as before.
 */

/** The version a write was made on, from its If-Match header; null when it names none. */
export function expectedVersionOf(req: Request): number | null {
  const raw = req.headers.get("if-match");
  if (raw === null || raw.trim() === "*") return null;
  const m = /^\s*"?(\d{1,9})"?\s*$/.exec(raw);
  if (!m)
    throw new PublicError(400, 'If-Match must name the record\'s version as an entity tag, e.g. If-Match: "3".', {
      "If-Match": ['Give the version as "3".'],
    });
  return Number(m[1]);
}

/** Refuses a write made on an older (or another) version of `current`. */
export function assertVersion<R extends { version: number }>(current: R, expected: number | null, what: string): void {
  if (expected === null || expected === current.version) return;
  throw conflict(
    `${what} was changed by someone else since this edit was made (the edit was made on version ${expected}; it is now version ${current.version}). Nothing was changed: compare the two and send the edit again if it should stand.`,
    { current, yourVersion: expected, currentVersion: current.version },
    "stale",
  );
}

/** The SET value that raises a version column by one. */
export const nextVersion = (column: AnyColumn) => sql`${column} + 1`;

/** True when an update names at least one field (an empty update changes nothing, its version included). */
export const namesAField = (input: object) => Object.values(input).some((v) => v !== undefined);
