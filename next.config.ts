import type { NextConfig } from "next";
import { withSerwist } from "@serwist/turbopack";
import {
  API_CONTENT_SECURITY_POLICY,
  SERVICE_WORKER_CONTENT_SECURITY_POLICY,
  securityHeaders,
} from "./lib/security-headers";

const config: NextConfig = {
  // PGlite opens its own files at run time; keep it out of the bundle (local-services.md).
  // rate-limiter-flexible loads its Drizzle helpers by a computed import that a bundle cannot follow.
  // pg-listen needs pg-format, which loads a file by a path computed at run time.
  // sql.js (the GeoPackage export) loads its WebAssembly file from beside its own script.
  serverExternalPackages: [
    "sql.js",
    "@electric-sql/pglite",
    "piscina",
    "sharp",
    "smtp-server",
    "mailparser",
    "nodemailer",
    "pg-boss",
    "rate-limiter-flexible",
    "pg-listen",
  ],
  experimental: {
    authInterrupts: true,
    // Loamwork's server actions post sign-in, reset and invitation forms: a few hundred bytes each.
    serverActions: { bodySizeLimit: "64kb" },
    // The proxy copies a page request's body before the page sees it; cap the copy just above the actions'
    // own limit, so an oversized action body is refused by that limit after at most this much is read.
    proxyClientMaxBodySize: "128kb",
  },
  poweredByHeader: false,
  // Pages get their headers, with a per-request nonce, from proxy.ts; the API's answers and the service
  // worker (which obeys its own script's policy) get them here.
  async headers() {
    const list = (policy: string) => Object.entries(securityHeaders(policy)).map(([key, value]) => ({ key, value }));
    return [
      { source: "/api/:path*", headers: list(API_CONTENT_SECURITY_POLICY) },
      {
        source: "/serwist/:path*",
        headers: [...list(SERVICE_WORKER_CONTENT_SECURITY_POLICY), { key: "Cache-Control", value: "no-cache" }],
      },
    ];
  },
  // Types are checked by `npm run typecheck` in the test command, once for the whole tree.
  typescript: { ignoreBuildErrors: true },
};

// Serwist bundles the service worker with esbuild at build time: keep esbuild out of the server bundle.
export default withSerwist(config);
