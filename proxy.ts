import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/lib/env";
import { newNonce, pageContentSecurityPolicy, securityHeaders, uploadOrigin } from "@/lib/security-headers";

/**
 * Every page answer carries the security headers, its Content-Security-Policy with a nonce fresh for this
 * request (Next reads it from the request's own policy header and puts it on its scripts). API answers get
 * theirs from next.config.ts: matching them here would make Next copy every request body for the proxy.
 *
 * Site pages without a session cookie go to sign-in: an optimistic redirect only. The real checks live in
 * every handler and action (lib/server/guard.ts); this never grants anything.
 */
export function proxy(req: NextRequest) {
  const nonce = newNonce();
  const config = env();
  const policy = pageContentSecurityPolicy({
    nonce,
    connectOrigins: [uploadOrigin(config.UPLOADTHING_INGEST_URL)],
    dev: config.NODE_ENV === "development",
  });
  const res = needsSignIn(req)
    ? signInRedirect(req)
    : NextResponse.next({ request: { headers: withPolicy(req.headers, nonce, policy) } });
  for (const [name, value] of Object.entries(securityHeaders(policy))) res.headers.set(name, value);
  return res;
}

function needsSignIn(req: NextRequest): boolean {
  const path = req.nextUrl.pathname;
  if (!path.startsWith("/sites") && !path.startsWith("/l/") && path !== "/scan") return false;
  return !req.cookies.getAll().some((c) => c.name.includes("authjs.session-token"));
}

function signInRedirect(req: NextRequest) {
  const url = new URL("/sign-in", req.url);
  url.searchParams.set("next", req.nextUrl.pathname);
  return NextResponse.redirect(url);
}

function withPolicy(headers: Headers, nonce: string, policy: string): Headers {
  const out = new Headers(headers);
  out.set("x-nonce", nonce);
  out.set("content-security-policy", policy);
  return out;
}

/**
 * Every page; not the API (see above), the service worker (next.config.ts), Next's static files or its image optimiser.
 */
export const config = { matcher: ["/((?!api/|serwist/|_next/static/|_next/image|favicon\\.ico).*)"] };
