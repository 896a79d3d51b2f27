import "server-only";
import { NextResponse } from "next/server";
import type { ZodType } from "zod";
import type { Db } from "@/db/client";
import { runGuarded, runPublic, type GuardContext, type GuardOutcome, type GuardSpec } from "./guard";

type RouteParams = Record<string, string | string[] | undefined>;
type Handler = (req: Request, ctx: { params: Promise<RouteParams> }) => Promise<Response>;

export type RouteSpec<I> = GuardSpec<I> & {
  /** Where the input comes from: the JSON body (writes) or the query string (lists). */
  from?: "body" | "query" | "none";
  /** Status of a successful answer (201 for creations). */
  successStatus?: number;
};

function respond<R>(outcome: GuardOutcome<R>, successStatus = 200): Response {
  if (!outcome.ok) {
    const { status, error, fieldErrors, details } = outcome;
    return NextResponse.json({ error, fieldErrors, details }, { status });
  }
  if (outcome.data instanceof Response) return outcome.data;
  return NextResponse.json(outcome.data ?? null, { status: successStatus });
}

const invalidJson = () => NextResponse.json({ error: "The request body is not valid JSON." }, { status: 400 });

async function readInput(req: Request, from: RouteSpec<unknown>["from"]): Promise<unknown> {
  if (from === "query") return Object.fromEntries(new URL(req.url).searchParams.entries());
  if (from === "none") return undefined;
  const text = await req.text();
  if (!text) return {};
  try {
    return JSON.parse(text);
  } catch {
    return { __invalidJson: true };
  }
}

/** A route handler behind the guarded entry. The site comes from the `siteId` path segment. */
export function guardedRoute<I, R>(
  spec: RouteSpec<I>,
  fn: (ctx: GuardContext<I> & { params: Record<string, string>; req: Request }) => Promise<R>,
): Handler {
  return async (req, routeCtx) => {
    const raw = (await routeCtx.params) ?? {};
    const params = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, String(v)]));
    const from = spec.from ?? (req.method === "GET" || req.method === "DELETE" ? "query" : "body");
    const input = await readInput(req, from);
    if (input && typeof input === "object" && "__invalidJson" in input) return invalidJson();
    const outcome = await runGuarded(spec, params.siteId, input, (ctx) => fn({ ...ctx, params, req }));
    return respond(outcome, spec.successStatus);
  };
}

/** A route handler for the entries used before sign-in (see runPublic); the JSON body is the input. */
export function publicRoute<I, R>(spec: { input: ZodType<I>; successStatus?: number }, fn: (ctx: { db: Db; input: I }) => Promise<R>) {
  return async (req: Request): Promise<Response> => {
    const input = await readInput(req, "body");
    if (input && typeof input === "object" && "__invalidJson" in input) return invalidJson();
    return respond(await runPublic(spec.input, input, fn), spec.successStatus);
  };
}
