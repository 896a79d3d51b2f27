/**
 * The security headers of every answer: pages get a Content-Security-Policy with a fresh nonce per request
 * (set by proxy.ts), API answers a policy that allows nothing to run (set in next.config.ts). Pure functions,
 * so the proxy, the config and the tests share them.
 */

/** Where the browser sends upload bytes: the upload service's ingest origin. */
export const HOSTED_UPLOAD_ORIGIN = "https://*.ingest.uploadthing.com";

/** The origin of the upload service the browser talks to: the configured ingest URL, else the hosted one. */
export function uploadOrigin(ingestUrl: string | undefined): string {
  if (!ingestUrl) return HOSTED_UPLOAD_ORIGIN;
  return new URL(ingestUrl).origin;
}

export type PagePolicyOptions = {
  /** Base64, fresh for every request; Next puts it on its own scripts. */
  nonce: string;
  /** Origins the page may fetch from besides its own (the upload service). */
  connectOrigins?: readonly string[];
  /** Development only: React's dev build evaluates code for its error overlay and call stacks. */
  dev?: boolean;
};

/**
 * The page policy. Scripts run only with this request's nonce ('strict-dynamic' lets those scripts load
 * the app's chunks); never 'unsafe-inline' for scripts. Styles allow 'unsafe-inline' (and so carry no
 * nonce, which would cancel it): server-rendered style attributes (plan and chart sizes, Next's own
 * elements) cannot carry a nonce. Images from this origin, blob: (photos chosen for upload) and data:.
 * A service worker and a manifest from this origin. Nothing may frame the app.
 */
export function pageContentSecurityPolicy({ nonce, connectOrigins = [], dev = false }: PagePolicyOptions): string {
  const directives: [string, ...string[]][] = [
    ["default-src", "'self'"],
    ["script-src", "'self'", `'nonce-${nonce}'`, "'strict-dynamic'", ...(dev ? ["'unsafe-eval'"] : [])],
    ["style-src", "'self'", "'unsafe-inline'"],
    ["img-src", "'self'", "blob:", "data:"],
    ["font-src", "'self'"],
    ["connect-src", "'self'", ...connectOrigins],
    ["worker-src", "'self'"],
    ["manifest-src", "'self'"],
    ["object-src", "'none'"],
    ["base-uri", "'self'"],
    ["form-action", "'self'"],
    ["frame-ancestors", "'none'"],
  ];
  return directives.map((d) => d.join(" ")).join("; ");
}

/** JSON, CSV, GeoJSON, photos and server-sent events: nothing in them may run or be framed. */
export const API_CONTENT_SECURITY_POLICY = "default-src 'none'; frame-ancestors 'none'";

/**
 * The service worker's own policy (a worker obeys the policy of its script's answer): it fetches and keeps
 * this origin's pages, files and API answers, and nothing else.
 */
export const SERVICE_WORKER_CONTENT_SECURITY_POLICY = "default-src 'self'; object-src 'none'; frame-ancestors 'none'";

/** Camera for photographing plans from this origin; every other powerful feature off. */
export const PERMISSIONS_POLICY = [
  "camera=(self)",
  "microphone=()",
  "geolocation=()",
  "display-capture=()",
  "payment=()",
  "usb=()",
  "serial=()",
  "bluetooth=()",
  "hid=()",
  "midi=()",
  "accelerometer=()",
  "gyroscope=()",
  "magnetometer=()",
].join(", ");

/** Every answer's security headers, given its Content-Security-Policy. */
export function securityHeaders(contentSecurityPolicy: string): Record<string, string> {
  return {
    "Content-Security-Policy": contentSecurityPolicy,
    "X-Frame-Options": "DENY",
    "Referrer-Policy": "same-origin",
    "Permissions-Policy": PERMISSIONS_POLICY,
    "X-Content-Type-Options": "nosniff",
  };
}

/** A fresh nonce: 16 random bytes in base64. */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}
