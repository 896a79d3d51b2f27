import { NextResponse, type NextRequest } from "next/server";
import { handlers } from "@/auth";
import { withBodyLimit } from "@/lib/server/http";
import { admitSignIn } from "@/lib/server/sign-in-limit";

/** Sign-in and sign-out forms are a few hundred bytes; nothing larger is read before the session exists. */
const AUTH_BODY_LIMIT = 16 * 1024;

export const GET = handlers.GET;

/** The e-mail of a credentials sign-in, read the way next-auth reads the body (form or JSON). */
async function postedEmail(req: NextRequest): Promise<unknown> {
  const type = req.headers.get("content-type") ?? "";
  try {
    if (type.includes("application/json")) return ((await req.clone().json()) as { email?: unknown } | null)?.email;
    if (type.includes("application/x-www-form-urlencoded"))
      return new URLSearchParams(await req.clone().text()).get("email");
  } catch {
    // next-auth refuses a body it cannot read; nothing to count
  }
  return undefined;
}

/** Sign-in tries are counted before next-auth checks the password; too many answer 429 with Retry-After. */
async function limitedPost(req: NextRequest): Promise<Response> {
  if (req.nextUrl.pathname.endsWith("/callback/credentials")) {
    const refused = await admitSignIn(await postedEmail(req), req.headers);
    if (refused)
      return NextResponse.json(
        { error: refused.message },
        { status: 429, headers: { "Retry-After": String(refused.retryAfterSeconds) } },
      );
  }
  return handlers.POST(req);
}

export const POST = withBodyLimit(AUTH_BODY_LIMIT, limitedPost);
