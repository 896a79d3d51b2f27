import "server-only";
import { NextResponse } from "next/server";
import { runGuarded, type GuardContext, type GuardSpec } from "./guard";

type RouteParams = Record<string, string | string[] | undefined>;
type Handler = (req: Request, ctx: { params: Promise<RouteParams> }) => Promise<Response>;

export type RouteSpec<I> = GuardSpec<I> & {
  /** Where the input comes from: the JSON body (writes) or the query string (lists). */
  from?: "body" | "query" | "none";
  /** Status of a successful answer (201 for creations). */
  successStatus?: number;
};

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
    if (input && typeof input === "object" && "__invalidJson" in input) {
      return NextResponse.json({ error: "The request body is not valid JSON." }, { status: 400 });
    }
    const outcome = await runGuarded(spec, params.siteId, input, (ctx) => fn({ ...ctx, params, req }));
    if (!outcome.ok) {
      const { status, ...body } = outcome;
      return NextResponse.json({ error: body.error, fieldErrors: body.fieldErrors, details: body.details }, { status });
    }
    if (outcome.data instanceof Response) return outcome.data;
    return NextResponse.json(outcome.data ?? null, { status: spec.successStatus ?? 200 });
  };
}
