import "server-only";
import { NextRequest, NextResponse } from "next/server";
import type { z, ZodType } from "zod";
import type { Db } from "@/db/client";
import { isUuid } from "@/lib/schemas/common";
import { PublicError, badInput, notFound } from "./errors";
import { assertKeyFits, idempotencyKeyOf, requestFingerprint, runIdempotent } from "./idempotency";
import { runGuarded, runPublic, toFailure, type GuardContext, type GuardOutcome, type GuardSpec } from "./guard";

type RouteParams = Record<string, string | string[] | undefined>;
type Handler = (req: Request, ctx: { params: Promise<RouteParams> }) => Promise<Response>;

/** The largest JSON body an entry reads unless its catalogue entry names its own limit. */
export const DEFAULT_BODY_LIMIT = 256 * 1024;
/** The entries used before sign-in take an address, a token and a password: nothing near this. */
export const PUBLIC_BODY_LIMIT = 16 * 1024;

export type RouteSpec<I> = GuardSpec<I> & {
  /** Where the input comes from: the JSON body (writes) or the query string (lists). */
  from?: "body" | "query" | "none";
  /** Status of a successful answer (201 for creations). */
  successStatus?: number;
  /** The largest body this entry reads, in bytes (DEFAULT_BODY_LIMIT when omitted). */
  maxBodyBytes?: number;
  /** The answer's schema in the catalogue: the handler must return what it accepts (or a Response). */
  response?: ZodType;
  /** How a write sent with an Idempotency-Key keeps its answer (lib/server/idempotency.ts); "atomic" when omitted. */
  idempotency?: "atomic" | "claim";
};

type InputOf<S> = S extends { input: infer Z extends ZodType } ? z.output<Z> : unknown;
/** The names in a catalogue path's braces: "/api/sites/{siteId}/finds/{findId}" → "siteId" | "findId". */
type PathNames<P> = P extends `${string}{${infer K}}${infer Rest}` ? K | PathNames<Rest> : never;
type ParamsOf<S> = S extends { path: infer P extends string }
  ? Record<PathNames<P>, string>
  : Record<string, string | undefined>;
type AnswerOf<S> = S extends { response: infer Z extends ZodType } ? z.input<Z> : unknown;

/** "256 KB", "48 MB": the limit as the refusal states it. */
export function formatByteLimit(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${+(bytes / (1024 * 1024)).toFixed(1)} MB`;
  return `${+(bytes / 1024).toFixed(1)} KB`;
}

export const bodyTooLarge = (limit: number) =>
  new PublicError(413, `The request body is too large: this entry accepts at most ${formatByteLimit(limit)}.`);

/**
 * Reads a request body, never more than `limit` bytes. A Content-Length above the limit is refused before
 * anything is read; the header is only a hint, so the bytes are counted as they arrive and reading stops as
 * soon as they pass the limit.
 */
export async function readBodyCapped(req: Request, limit: number): Promise<Uint8Array> {
  const declared = Number(req.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > limit) throw bodyTooLarge(limit);
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      reader.releaseLock();
      throw bodyTooLarge(limit);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}

function respond<R>(outcome: GuardOutcome<R>, successStatus = 200): Response {
  if (!outcome.ok) {
    const { status, error, code, fieldErrors, details } = outcome;
    return NextResponse.json({ error, code, fieldErrors, details }, { status });
  }
  if (outcome.data instanceof Response) return outcome.data;
  return NextResponse.json(outcome.data ?? null, { status: successStatus });
}

async function readInput(
  req: Request,
  from: RouteSpec<unknown>["from"],
  limit: number,
  seen?: { text: string },
): Promise<unknown> {
  if (from === "query") return Object.fromEntries(new URL(req.url).searchParams.entries());
  if (from === "none" && !seen) return undefined;
  const text = new TextDecoder().decode(await readBodyCapped(req, limit));
  if (seen) seen.text = text;
  if (from === "none") return undefined;
  if (!text) return {};
  try {
    return JSON.parse(text);
  } catch {
    throw badInput("The request body is not valid JSON.");
  }
}

/** A path segment named `…Id` that is not a UUID names no record: 404 before anything is looked up. */
function malformedId(params: Record<string, string>): PublicError | null {
  const bad = Object.entries(params).find(([name, value]) => name.endsWith("Id") && !isUuid(value));
  if (!bad) return null;
  const what = bad[0] === "userId" ? "member" : bad[0].slice(0, -2).replace(/[A-Z]/g, (c) => ` ${c.toLowerCase()}`);
  return notFound(`That ${what}`);
}

/**
 * A route handler behind the guarded entry. The site comes from the `siteId` path segment. The body is read
 * only after the session and the role on the site are checked, and never past the entry's limit. A write
 * (POST, PATCH, DELETE) that carries an Idempotency-Key runs exactly once (lib/server/idempotency.ts).
 */
export function guardedRoute<S extends RouteSpec<unknown>>(
  spec: S,
  fn: (ctx: GuardContext<InputOf<S>> & { params: ParamsOf<S>; req: Request }) => Promise<AnswerOf<S> | Response>,
): Handler {
  const named =
    "path" in spec && typeof spec.path === "string" ? [...spec.path.matchAll(/\{(\w+)\}/g)].map((m) => m[1] ?? "") : [];
  return async (req, routeCtx) => {
    const raw = (await routeCtx.params) ?? {};
    const params: Record<string, string> = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, String(v)]));
    // A path segment the catalogue names but the request lacks is a page that does not exist.
    if (named.some((name) => params[name] === undefined)) return respond(toFailure(notFound("That page")));
    const malformed = malformedId(params);
    if (malformed) return respond(toFailure(malformed));
    const from = spec.from ?? (req.method === "GET" || req.method === "DELETE" ? "query" : "body");
    const limit = spec.maxBodyBytes ?? DEFAULT_BODY_LIMIT;
    let key: string | null = null;
    try {
      key = req.method === "GET" || req.method === "HEAD" ? null : idempotencyKeyOf(req);
    } catch (err) {
      return respond(toFailure(err));
    }
    if (!key) {
      const outcome = await runGuarded(
        spec as GuardSpec<InputOf<S>>,
        params.siteId,
        () => readInput(req, from, limit),
        (ctx) => fn({ ...ctx, params: params as ParamsOf<S>, req }),
      );
      return respond(outcome, spec.successStatus);
    }
    const seen = { text: "" };
    const request = (userId: string) => ({
      userId,
      key: key as string,
      method: req.method,
      path: new URL(req.url).pathname,
      fingerprint: requestFingerprint(req.method, req.url, seen.text),
    });
    const readKeyed = async (userId: string, db: Db) => {
      const input = await readInput(req, from, limit, seen);
      await assertKeyFits(db, request(userId));
      return input;
    };
    const outcome = await runGuarded(spec as GuardSpec<InputOf<S>>, params.siteId, readKeyed, (ctx) =>
      runIdempotent(ctx.db, request(ctx.userId), spec.idempotency ?? "atomic", spec.successStatus ?? 200, (db) =>
        fn({ ...ctx, db, params: params as ParamsOf<S>, req }),
      ),
    );
    return respond(outcome, spec.successStatus);
  };
}

/** A route handler for the entries used before sign-in (see runPublic); the JSON body is the input. */
export function publicRoute<I, R>(
  spec: { input: ZodType<I>; successStatus?: number; maxBodyBytes?: number },
  fn: (ctx: { db: Db; input: I }) => Promise<R>,
) {
  return async (req: Request): Promise<Response> => {
    let input: unknown;
    try {
      input = await readInput(req, "body", spec.maxBodyBytes ?? PUBLIC_BODY_LIMIT);
    } catch (err) {
      return respond(toFailure(err));
    }
    return respond(await runPublic(spec.input, input, fn), spec.successStatus);
  };
}

/**
 * For handlers that read their own body (the sign-in callbacks, the upload route): the body is read here
 * under `limit` and handed on in a fresh request, so an oversized body is refused before the handler runs.
 */
export function withBodyLimit<C>(limit: number, handler: (req: NextRequest, ctx: C) => Promise<Response>) {
  return async (req: NextRequest, ctx: C): Promise<Response> => {
    if (req.method === "GET" || req.method === "HEAD") return handler(req, ctx);
    let body: Uint8Array;
    try {
      body = await readBodyCapped(req, limit);
    } catch (err) {
      return respond(toFailure(err));
    }
    return handler(
      new NextRequest(req.url, {
        method: req.method,
        headers: req.headers,
        body: body as BodyInit,
        signal: req.signal,
      }),
      ctx,
    );
  };
}
