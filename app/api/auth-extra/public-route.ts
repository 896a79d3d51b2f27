import "server-only";
import { NextResponse } from "next/server";
import type { ZodType } from "zod";
import { getDb, type Db } from "@/db/client";
import { badInput } from "@/lib/server/errors";
import { describeFieldErrors, toFailure, zodFieldErrors } from "@/lib/server/guard";

/**
 * The entries a person uses before they can sign in (password reset, accepting an invitation). They cannot go
 * through the guarded entry, which starts by demanding a session; they parse with zod and map errors the same
 * way, and each proves its right with a single-use token instead of a session.
 */
export function publicRoute<I, R>(schema: ZodType<I>, fn: (db: Db, input: I) => Promise<R>) {
  return async (req: Request): Promise<Response> => {
    try {
      let raw: unknown;
      try {
        raw = JSON.parse((await req.text()) || "{}");
      } catch {
        return NextResponse.json({ error: "The request body is not valid JSON." }, { status: 400 });
      }
      const parsed = schema.safeParse(raw);
      if (!parsed.success) {
        const fieldErrors = zodFieldErrors(parsed.error);
        throw badInput(`Check the input — ${describeFieldErrors(fieldErrors)}`, fieldErrors);
      }
      return NextResponse.json(await fn(await getDb(), parsed.data));
    } catch (err) {
      const { status, error, fieldErrors, details } = toFailure(err);
      return NextResponse.json({ error, fieldErrors, details }, { status });
    }
  };
}
