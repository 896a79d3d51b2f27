import type { ReasonCode } from "@/lib/api/offline";

/**
 * Deliberate failures whose message is meant for the person using Loamwork (style.md habit 2).
 * Anything else thrown inside a guarded entry is logged and shown as a generic failure.
 */
export class PublicError extends Error {
  constructor(
    readonly status: 400 | 401 | 403 | 404 | 409 | 413 | 422 | 429,
    message: string,
    readonly fieldErrors?: Record<string, string[]>,
    readonly details?: unknown,
    /** A stable reason code (lib/api/offline.ts) a device can act on; derived from the status when omitted. */
    readonly code?: ReasonCode,
  ) {
    super(message);
    this.name = "PublicError";
  }
}

export const unauthenticated = () => new PublicError(401, "Sign in to continue.");
/** Also used for sites the user is not a member of: their existence is not revealed. */
export const notFound = (what = "That record") => new PublicError(404, `${what} was not found.`);
export const forbidden = (message = "Your role on this site does not allow that.") => new PublicError(403, message);
export const badInput = (message: string, fieldErrors?: Record<string, string[]>, details?: unknown) =>
  new PublicError(400, message, fieldErrors, details);
export const conflict = (message: string, details?: unknown, code?: ReasonCode) =>
  new PublicError(409, message, undefined, details, code);

export function isPublicError(err: unknown): err is PublicError {
  return err instanceof PublicError;
}

/** Postgres error codes we translate into messages (unique violation, the audit trigger). */
export function pgErrorCode(err: unknown): string | undefined {
  let e: unknown = err;
  for (let depth = 0; e && depth < 4; depth++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && /^[0-9A-Z]{5}$/.test(code)) return code;
    e = (e as { cause?: unknown }).cause;
  }
  return undefined;
}
