import { NextResponse, type NextRequest } from "next/server";

/**
 * Optimistic redirect only: pages without a session cookie go to sign-in. The real checks live in every
 * handler and action (lib/server/guard.ts); this never grants anything.
 */
export function proxy(req: NextRequest) {
  const hasSession = req.cookies.getAll().some((c) => c.name.includes("authjs.session-token"));
  if (!hasSession) {
    const url = new URL("/sign-in", req.url);
    url.searchParams.set("next", req.nextUrl.pathname);
    return NextResponse.redirect(url);
  }
  return NextResponse.next();
}

export const config = { matcher: ["/sites/:path*"] };
