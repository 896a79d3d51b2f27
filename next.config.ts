import type { NextConfig } from "next";

const config: NextConfig = {
  // PGlite opens its own files at run time; keep it out of the bundle (local-services.md).
  serverExternalPackages: ["@electric-sql/pglite", "piscina", "sharp", "smtp-server", "mailparser", "nodemailer", "pg-boss"],
  experimental: {
    authInterrupts: true,
    // Loamwork's server actions post sign-in, reset and invitation forms: a few hundred bytes each.
    serverActions: { bodySizeLimit: "64kb" },
    // The proxy copies a page request's body before the page sees it; cap the copy just above the actions'
    // own limit, so an oversized action body is refused by that limit after at most this much is read.
    proxyClientMaxBodySize: "128kb",
  },
  poweredByHeader: false,
  // Types are checked by `npm run typecheck` in the test command, once for the whole tree.
  typescript: { ignoreBuildErrors: true },
};

export default config;
