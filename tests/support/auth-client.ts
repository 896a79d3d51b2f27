import { vi } from "vitest";
import { NextRequest } from "next/server";

/**
 * Drives Loamwork's sign-in the way a plain HTTP client does (GET /api/auth/csrf, POST the credentials, keep
 * the cookies), in-process through the real next-auth route, so a test can save a session cookie and replay
 * it later. `asRequest` makes that cookie the one the app reads through next/headers for the next call.
 */
const current = { cookie: "", headers: {} as Record<string, string> };

vi.mock("next/headers", () => ({
  headers: async () =>
    new Headers({ host: "localhost:3000", "x-forwarded-proto": "http", ...current.headers, cookie: current.cookie }),
  cookies: async () => {
    throw new Error("tests drive next-auth through its HTTP routes, not its server actions");
  },
}));

type AuthRoute = { GET: (req: NextRequest) => Promise<Response>; POST: (req: NextRequest) => Promise<Response> };
const route = async (): Promise<AuthRoute> =>
  (await import("@/app/api/auth/[...nextauth]/route")) as unknown as AuthRoute;

const base = "http://localhost:3000";

/** Cookies as a browser would keep them: name → value, later Set-Cookie lines replacing earlier ones. */
export class CookieJar {
  private readonly cookies = new Map<string, string>();
  take(res: Response): void {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(";");
      const eq = pair.indexOf("=");
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1);
      if (value === "" || /max-age=0|expires=thu, 01 jan 1970/i.test(line)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }
  header(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }
  sessionCookie(): string {
    return [...this.cookies]
      .filter(([k]) => k.includes("session-token"))
      .map(([k, v]) => `${k}=${v}`)
      .join("; ");
  }
}

async function authCall(
  method: "GET" | "POST",
  path: string,
  jar: CookieJar,
  form?: Record<string, string>,
  extraHeaders: Record<string, string> = {},
) {
  const headers: Record<string, string> = { cookie: jar.header(), ...extraHeaders };
  if (form) headers["content-type"] = "application/x-www-form-urlencoded";
  const req = new NextRequest(`${base}/api/auth/${path}`, {
    method,
    headers,
    body: form ? new URLSearchParams(form).toString() : undefined,
  });
  const res = await (await route())[method](req);
  jar.take(res);
  return res;
}

async function csrf(jar: CookieJar): Promise<string> {
  const res = await authCall("GET", "csrf", jar);
  return ((await res.json()) as { csrfToken: string }).csrfToken;
}

/** Signs in through POST /api/auth/callback/credentials; the jar then holds the session cookie if it worked. */
export async function signInOverHttp(
  jar: CookieJar,
  email: string,
  password: string,
  extraHeaders: Record<string, string> = {},
): Promise<Response> {
  const csrfToken = await csrf(jar);
  return authCall(
    "POST",
    "callback/credentials",
    jar,
    { csrfToken, email, password, callbackUrl: `${base}/sites` },
    extraHeaders,
  );
}

/** Signs out through POST /api/auth/signout, as the sign-out button's request does. */
export async function signOutOverHttp(jar: CookieJar): Promise<Response> {
  const csrfToken = await csrf(jar);
  return authCall("POST", "signout", jar, { csrfToken, callbackUrl: `${base}/sign-in` });
}

/** GET /api/auth/session with exactly this cookie header: the user's id, or null when the session is refused. */
export async function sessionUserId(cookie: string): Promise<string | null> {
  const req = new NextRequest(`${base}/api/auth/session`, { headers: { cookie } });
  const res = await (await route()).GET(req);
  const body = (await res.json()) as { user?: { id?: string } } | null;
  return body?.user?.id ?? null;
}

/** Runs `fn` as a request carrying this cookie header (what auth() and currentUserId() read), and these headers. */
export async function asRequest<T>(
  cookie: string,
  fn: () => Promise<T>,
  headers: Record<string, string> = {},
): Promise<T> {
  current.cookie = cookie;
  current.headers = headers;
  try {
    return await fn();
  } finally {
    current.cookie = "";
    current.headers = {};
  }
}
