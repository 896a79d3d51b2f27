import "server-only";
import { z, type ZodType } from "zod";
import { getDb, type Db } from "@/db/client";
import type { Role } from "@/db/schema";
import { reasonForStatus, type ReasonCode } from "@/lib/api/offline";
import { PublicError, badInput, isPublicError, pgErrorCode, unauthenticated } from "./errors";
import { assertRole, loadSiteActor, type SiteActor } from "./membership";
import { currentUserId } from "./session";

/**
 * The one guarded entry for every server action and route handler (style.md habit 1):
 * authenticate → look up the role on this site → check it → parse input with zod → run → map errors.
 */
export type GuardSpec<I> = {
  /** Roles allowed on the site named by `siteId`; "member" lets any member read. Omit for user-level entries. */
  roles?: readonly Role[] | "member";
  /** What the caller is trying to do, for the refusal message ("record finds"). */
  doing?: string;
  input?: ZodType<I>;
};

export type GuardContext<I> = { db: Db; userId: string; actor: SiteActor | null; input: I };

export type GuardOutcome<R> =
  | { ok: true; data: R }
  | {
      ok: false;
      status: number;
      error: string;
      code: ReasonCode;
      fieldErrors?: Record<string, string[]>;
      details?: unknown;
    };

export function zodFieldErrors(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join(".") : "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

export function describeFieldErrors(fieldErrors: Record<string, string[]>): string {
  return Object.entries(fieldErrors)
    .map(([field, messages]) => (field === "_" ? messages.join("; ") : `${field}: ${messages.join("; ")}`))
    .join(" · ");
}

/** Turns anything thrown into an outcome; only PublicError messages reach the user. */
export function toFailure(err: unknown): Extract<GuardOutcome<never>, { ok: false }> {
  if (err instanceof z.ZodError) {
    const fieldErrors = zodFieldErrors(err);
    return {
      ok: false,
      status: 400,
      error: `Check the input — ${describeFieldErrors(fieldErrors)}`,
      code: "invalid",
      fieldErrors,
    };
  }
  if (isPublicError(err)) {
    return {
      ok: false,
      status: err.status,
      error: err.message,
      code: err.code ?? reasonForStatus(err.status),
      fieldErrors: err.fieldErrors,
      details: err.details,
    };
  }
  const code = pgErrorCode(err);
  if (code === "23505")
    return { ok: false, status: 409, error: "That number or code is already taken on this site.", code: "duplicate" };
  if (code === "23503")
    return { ok: false, status: 409, error: "Other records still refer to this one.", code: "conflict" };
  if (code === "40001" || code === "40P01")
    return { ok: false, status: 409, error: "Someone else changed this at the same moment; try again.", code: "busy" };
  console.error("[loamwork] unexpected failure", err);
  return { ok: false, status: 500, error: "Something went wrong on the server; nothing was changed.", code: "server" };
}

export async function runGuarded<I, R>(
  spec: GuardSpec<I>,
  siteId: string | undefined,
  /** Called only after the session and the role are checked, so a large body is never read for a stranger. */
  readInput: (userId: string, db: Db) => unknown,
  fn: (ctx: GuardContext<I>) => Promise<R>,
): Promise<GuardOutcome<R>> {
  try {
    const userId = await currentUserId();
    if (!userId) throw unauthenticated();
    const db = await getDb();
    let actor: SiteActor | null = null;
    if (spec.roles) {
      if (!siteId) throw new PublicError(404, "That site was not found.");
      actor = await loadSiteActor(db, userId, siteId);
      if (spec.roles !== "member") assertRole(actor, spec.roles, spec.doing);
    }
    const input = parseInput(spec.input, await readInput(userId, db));
    return { ok: true, data: await fn({ db, userId, actor, input }) };
  } catch (err) {
    return toFailure(err);
  }
}

/** The path of the first string (or key) holding a NUL character, which no text column can store. */
function nulPath(value: unknown, path: string, depth = 0): string | null {
  if (typeof value === "string") return value.includes("\u0000") ? path || "_" : null;
  if (!value || typeof value !== "object" || depth > 64) return null;
  for (const [key, inner] of Object.entries(value)) {
    const at = path ? `${path}.${key}` : key;
    if (key.includes("\u0000")) return at;
    const found = nulPath(inner, at, depth + 1);
    if (found) return found;
  }
  return null;
}

function parseInput<I>(schema: ZodType<I> | undefined, raw: unknown): I {
  const nul = nulPath(raw, "");
  if (nul)
    throw badInput(`Check the input — ${nul}: text cannot contain a NUL character (\\u0000).`, {
      [nul]: ["Text cannot contain a NUL character (\\u0000)."],
    });
  if (!schema) return raw as I;
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const fieldErrors = zodFieldErrors(parsed.error);
    throw badInput(`Check the input — ${describeFieldErrors(fieldErrors)}`, fieldErrors);
  }
  return parsed.data;
}

/**
 * The entries a person uses before they can sign in (password reset, accepting an invitation): the same
 * parsing and error mapping, no session demanded; each proves its right with a single-use token instead.
 */
export async function runPublic<I, R>(
  schema: ZodType<I>,
  rawInput: unknown,
  fn: (ctx: { db: Db; input: I }) => Promise<R>,
): Promise<GuardOutcome<R>> {
  try {
    const input = parseInput(schema, rawInput);
    return { ok: true, data: await fn({ db: await getDb(), input }) };
  } catch (err) {
    return toFailure(err);
  }
}

/** The actor of a site-scoped entry (runGuarded with `roles` always sets it). */
export function siteActor<I>(ctx: GuardContext<I>): SiteActor {
  if (!ctx.actor) throw new Error("guard: this entry was declared without site roles");
  return ctx.actor;
}
